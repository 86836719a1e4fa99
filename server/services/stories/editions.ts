// A story's data and its editions. liveStoryData snapshots what the story's figures
// use from the workspace as it is now (the editor's preview, preview links, the number
// check); an edition freezes that snapshot with the approved text when an editor
// approves, and readers only ever see a published edition. Figures are built from
// either by shared/utils/story-view.ts, so the desk and readers see the same numbers.
import { createHash } from 'node:crypto'
import type { Knex } from 'knex'
import type { Db } from '../../utils/db'
import { STORY_DATA_FORMAT, type StoryData, type StoryEditionStatus, type StoryEditionSummary } from '#shared/types/story-data'
import type { CurrentUser } from '#shared/types/users'
import type { StoryFigures, StoryPhoto } from '#shared/types/stories'
import type { AnalysisUnits } from '#shared/types/analysis'
import type { CorrectionStandard } from '#shared/dyno'
import type { BenchTest } from '#shared/types/bench-tests'
import type { BuildSheet } from '#shared/types/build-sheets'
import type { Setup } from '#shared/types/setups'
import type { DayReport } from '#shared/types/dyno-day'
import { canonicalJson, movedFigures, STORY_ROUNDING, storyFiguresFromData } from '#shared/utils/story-view'
import { setupsUsed, type SetupsUsed } from '#shared/utils/story-figure-use'
import { LruCache } from '#shared/utils/lru-cache'
import { usedPhotoIds } from './photos'
import { requireStoryRow, type StoryRow } from './stories'
import { loadBenchData } from '../workspace/analysis'
import { toBenchTest } from '../workspace/bench-test-core'
import { getBuildSheet } from '../workspace/build-sheets'
import { getDayView } from '../workspace/dyno-day'
import { listSetups } from '../workspace/setups'

type TextRow = Pick<StoryRow, 'id' | 'bench_test_id' | 'body' | 'hero_photo_id'>

// Edit bookkeeping changes without the figures changing; it is not part of the data.
function frozenSetup(s: Setup): Setup {
  return { ...s, pullCount: 0, includedPullCount: 0, version: 0, updatedAt: '', deletedAt: null, idleChecks: s.idleChecks.map(c => ({ ...c, createdAt: '' })) }
}
function frozenBuildSheet(b: BuildSheet | null): BuildSheet | null {
  return b ? { ...b, version: 0, updatedAt: '' } : null
}

/** The plan against what happened, as the day view reports it; null while the bench test has no plan. */
export async function storyDayReport(db: Db, benchTest: Pick<BenchTest, 'id' | 'defaultStandard'>): Promise<DayReport | null> {
  const day = await getDayView(db, benchTest.id, benchTest.defaultStandard)
  return day.plan.version === 0 ? null : day.report
}

/** What the story's figures use, from the workspace as it is now. */
export async function liveStoryData(db: Db, row: TextRow, uses?: SetupsUsed): Promise<StoryData> {
  const benchRow = await db('bench_tests').join('users as owner', 'owner.id', 'bench_tests.owner_id')
    .where('bench_tests.id', row.bench_test_id).first('bench_tests.*', 'owner.display_name as owner_name')
  if (!benchRow) notFound('The bench test of this story is gone.')
  const benchTest = toBenchTest(benchRow)
  const used = uses ?? setupsUsed(row.body)
  const [live, photoIds, buildSheet, dayReport] = await Promise.all([
    listSetups(db, benchTest.id),
    usedPhotoIds(db, row),
    used.buildSheet ? getBuildSheet(db, benchTest.id) : Promise.resolve(null),
    used.dayReport ? storyDayReport(db, benchTest) : Promise.resolve(undefined),
  ])
  let chosen: Setup[] = []
  if (used.all) chosen = live
  else if (used.ids.length) {
    const baseline = live.find(s => s.isBaseline && s.includedPullCount > 0) ?? live.find(s => s.includedPullCount > 0)
    chosen = live.filter(s => used.ids.includes(s.id) || s === baseline)
  }
  const { data: bench } = await loadBenchData(db, benchTest, chosen.map(s => s.id))
  return asFrozen({
    format: STORY_DATA_FORMAT,
    benchTest: { id: benchTest.id, title: benchTest.title, shop: benchTest.shop, dyno: benchTest.dyno, testedFrom: benchTest.testedFrom, testedTo: benchTest.testedTo },
    bench,
    setups: chosen.map(frozenSetup),
    buildSheet: frozenBuildSheet(buildSheet),
    // The key only when the body shows the day, so other stories' data (and hashes) stay as they were.
    ...(dayReport !== undefined ? { dayReport } : {}),
    photoIds,
    rounding: STORY_ROUNDING,
  })
}

/**
 * The live data in the very form an edition keeps it (canonical JSON read back: keys in
 * order, dates as strings). Figures and views are kept by content hash, which the live
 * data shares with its edition: built from the live data first (the desk's preview), the
 * published answers of this server listed keys in another order than those of a server
 * that read the edition, so the same edition was other bytes and another ETag there.
 */
function asFrozen(data: StoryData): StoryData {
  return JSON.parse(canonicalJson(data)) as StoryData
}

export function storyDataHash(data: StoryData): string {
  return createHash('sha256').update(canonicalJson(data)).digest('hex')
}

// ---------- figures from data ----------

// Figures of one set of data in one standard and units, kept per process: an
// edition never changes, and a live snapshot is keyed by its hash.
const figureCache = new LruCache<StoryFigures>(300)

export interface FigureRequest {
  standard?: CorrectionStandard
  units?: AnalysisUnits
  photos: StoryPhoto[]
}

/** The figures of this data (the photos are resolved by the caller: their addresses differ by audience). */
export function figuresOf(data: StoryData, hash: string, req: FigureRequest): StoryFigures {
  const key = JSON.stringify([hash, req.standard ?? '', req.units ?? '', req.photos.map(p => p.variants[0]?.url ?? p.id)])
  const kept = figureCache.get(key)
  if (kept) return kept
  const figures = storyFiguresFromData(data, req.photos, { standard: req.standard, units: req.units })
  figureCache.set(key, figures)
  return figures
}

// ---------- editions ----------

interface EditionRow {
  id: number
  story_id: number
  number: number
  content_hash: string
  data: string
  headline: string
  deck: string
  body: string
  approved_by: number | null
  approver_name?: string | null
  approved_at: Date | string
  published_at: Date | string | null
  correction_note: string
  search_title: string | null
  search_description: string | null
  hero_photo_id: number | null
}

export interface Edition extends StoryEditionSummary {
  data: StoryData
  headline: string
  deck: string
  body: string
  /** Null on editions frozen before these were kept: the story row's then stands. */
  searchTitle: string | null
  searchDescription: string | null
  heroPhotoId: number | null | undefined
}

function toSummary(row: EditionRow): StoryEditionSummary {
  return {
    id: row.id,
    storyId: row.story_id,
    number: row.number,
    contentHash: row.content_hash,
    approvedBy: row.approved_by === null ? null : { userId: row.approved_by, displayName: row.approver_name ?? '' },
    approvedAt: isoTimeRequired(row.approved_at),
    publishedAt: isoTime(row.published_at),
    correctionNote: row.correction_note,
  }
}

// Parsed once per process: an edition's row never changes after it is written
// (only published_at, which is read with the summary, not kept here).
const editionData = new LruCache<StoryData>(200)

function toEdition(row: EditionRow): Edition {
  let data = editionData.get(String(row.id))
  if (!data) {
    data = JSON.parse(row.data) as StoryData
    editionData.set(String(row.id), data)
  }
  return {
    ...toSummary(row),
    data,
    headline: row.headline,
    deck: row.deck,
    body: row.body,
    searchTitle: row.search_title,
    searchDescription: row.search_description,
    // Older editions kept no hero: undefined says "the row's", null says "none".
    heroPhotoId: row.search_title === null ? undefined : row.hero_photo_id,
  }
}

const editionQuery = (db: Db) => db<EditionRow>('story_editions').leftJoin('users', 'users.id', 'story_editions.approved_by')
  .select('story_editions.*', 'users.display_name as approver_name')

export async function listEditions(db: Db, storyId: number): Promise<StoryEditionSummary[]> {
  const rows = await editionQuery(db).clearSelect().select('story_editions.id', 'story_id', 'number', 'content_hash', 'approved_by', 'approved_at', 'published_at', 'correction_note', 'users.display_name as approver_name')
    .where('story_editions.story_id', storyId).orderBy('number') as EditionRow[]
  return rows.map(toSummary)
}

/** The newest edition (approved, maybe not yet published). */
export async function latestEdition(db: Db, storyId: number): Promise<Edition | null> {
  const row = await editionQuery(db).where('story_editions.story_id', storyId).orderBy('number', 'desc').first() as EditionRow | undefined
  return row ? toEdition(row) : null
}

/** The edition readers see: the newest one that went live. */
export async function publishedEdition(db: Db, storyId: number): Promise<Edition | null> {
  const row = await editionQuery(db).where('story_editions.story_id', storyId).whereNotNull('story_editions.published_at')
    .orderBy('number', 'desc').first() as EditionRow | undefined
  return row ? toEdition(row) : null
}

/** Freezes the story's text and the data its figures use now; inside the approving transaction. */
export async function createEdition(trx: Knex.Transaction, row: StoryRow, by: number | null, opts: { correctionNote?: string, publish?: boolean } = {}): Promise<number> {
  const data = await liveStoryData(trx, row)
  const last = await trx('story_editions').where('story_id', row.id).max({ n: 'number' }).first() as { n: number | null } | undefined
  const [id] = await trx('story_editions').insert({
    story_id: row.id,
    number: Number(last?.n ?? 0) + 1,
    content_hash: storyDataHash(data),
    data: canonicalJson(data),
    headline: row.headline,
    deck: row.deck,
    body: row.body,
    approved_by: by,
    correction_note: opts.correctionNote ?? '',
    published_at: opts.publish ? trx.raw('NOW(3)') : null,
    search_title: row.search_title,
    search_description: row.search_description,
    hero_photo_id: row.hero_photo_id,
  })
  if (opts.publish) await markPublished(trx, row.id, Number(id))
  return Number(id)
}

// The lists, search and feeds read the published edition through this key. Setting
// updated_at to itself: naming the edition is not an edit of the story.
async function markPublished(trx: Knex.Transaction, storyId: number, editionId: number): Promise<void> {
  await trx('stories').where('id', storyId).update({ published_edition_id: editionId, updated_at: trx.raw('updated_at') })
}

/**
 * On going live: the newest edition is what goes out. A story moved to approved
 * without one (older data, or set by hand) gets its edition frozen now.
 */
export async function publishLatestEdition(trx: Knex.Transaction, row: StoryRow, by: number | null): Promise<void> {
  const latest = await trx('story_editions').where('story_id', row.id).orderBy('number', 'desc').first('id', 'published_at') as { id: number, published_at: Date | null } | undefined
  if (!latest) {
    await createEdition(trx, row, by, { publish: true })
    return
  }
  if (!latest.published_at) await trx('story_editions').where('id', latest.id).update({ published_at: trx.raw('NOW(3)') })
  await markPublished(trx, row.id, latest.id)
}

// ---------- changes since approval ----------

/**
 * The story's editions, and whether what an approval froze still holds: the live data
 * for the approved text against the edition's, with every figure whose value moves.
 */
export async function storyEditionStatus(db: Db, user: CurrentUser, storyId: number): Promise<StoryEditionStatus> {
  const row = await requireStoryRow(db, user, storyId)
  const [current, published, editions] = await Promise.all([latestEdition(db, row.id), publishedEdition(db, row.id), listEditions(db, row.id)])
  if (!current) return { current: null, published: null, dataChanged: false, textChanged: false, moved: [], editions }
  const live = await liveStoryData(db, { ...row, body: current.body })
  const liveHash = storyDataHash(live)
  const dataChanged = liveHash !== current.contentHash
  const moved = dataChanged
    ? movedFigures(current.body, figuresOf(current.data, current.contentHash, { photos: [] }), figuresOf(live, liveHash, { photos: [] }))
    : []
  const summary = (e: Edition | null) => (e ? editions.find(x => x.id === e.id) ?? null : null)
  return {
    current: summary(current),
    published: summary(published),
    dataChanged,
    textChanged: current.headline !== row.headline || current.deck !== row.deck || current.body !== row.body,
    moved,
    editions,
  }
}
