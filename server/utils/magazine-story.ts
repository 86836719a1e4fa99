// One story as a reader sees it: published only. A withdrawn story answers 410
// (it was here and is gone on purpose); anything else unpublished is 404, except
// for the desk (its bylines, editors and admins), who see it marked as a preview.
import type { H3Event } from 'h3'
import type { Knex } from 'knex'
import type { z } from 'zod'
import { ANALYSIS_UNITS } from '#shared/types/analysis'
import { AnalysisQuery, type AnalysisQueryInput, type AnalysisResponse } from '#shared/types/workspace'
import type { FigureComparison } from '#shared/types/story-figures'
import type { StoryReaderView } from '#shared/types/stories'
import type { MagazineStoryResponse } from '#shared/types/magazine'
import type { CurrentUser } from '#shared/types/users'
import type { EngineFamily, PartType } from '#shared/types/catalog'
import { rolesAtLeast } from '#shared/types/roles'
import { withRoundedCurves } from '#shared/utils/curve-precision'
import { deepFreeze } from '#shared/utils/deep-freeze'
import { LruCache } from '#shared/utils/lru-cache'
import type { BenchTestRecord } from './bench-access'

/** The reader's switches: correction standard and units (figures in the text stay in hp and lb-ft). */
export const ReaderAnalysisQuery = AnalysisQuery.pick({ standard: true, units: true })
export type ReaderAnalysisInput = z.infer<typeof ReaderAnalysisQuery>

interface StoryRow {
  id: number
  bench_test_id: number
  slug: string
  headline: string
  deck: string
  body: string
  hero_photo_id: number | null
  engine_family: EngineFamily
  part_type: PartType
  search_title: string
  search_description: string
  version: number
  state: StoryReaderView['story']['state']
  published_at: Date | string | null
  updated_at: Date | string
}

export interface ReaderStory { row: StoryRow, preview: boolean }

async function mayPreview(db: Knex, user: CurrentUser | null, storyId: number): Promise<boolean> {
  if (!user) return false
  if (user.role === 'editor' || user.role === 'admin') return true
  if (!rolesAtLeast('writer').includes(user.role)) return false
  return Boolean(await db('story_bylines').where({ story_id: storyId, user_id: user.id }).first('user_id'))
}

/** The story for this slug as the caller may read it, or the 404/410 a reader gets. */
export async function findReaderStory(slug: string, user: CurrentUser | null, db: Knex = useDb()): Promise<ReaderStory> {
  const row = await db<StoryRow>('stories').where({ slug }).first()
  if (!row) notFound('No such story.')
  if (row.state === 'published') return { row, preview: false }
  if (await mayPreview(db, user, row.id)) return { row, preview: true }
  if (row.state === 'withdrawn') throw createError({ statusCode: 410, statusMessage: 'Gone', message: 'This story was withdrawn by the editors.' })
  notFound('No such story.')
}

async function benchTestOf(db: Knex, id: number): Promise<BenchTestRecord & { owner_name: string }> {
  const row = await db('bench_tests').join('users as owner', 'owner.id', 'bench_tests.owner_id')
    .where('bench_tests.id', id).first('bench_tests.*', 'owner.display_name as owner_name')
  if (!row) notFound('No such story.')
  return row
}

// What a reader's graph needs, and no more: every page carries its curves in the
// payload. 200 points is more than a graph is wide in pixels at a phone's width and
// close to the server SVG's 160; two decimals sit far below the readout's 0.1.
const READER_CURVE_POINTS = 200
const READER_CURVE_PLACES = 2

/** The story's analysis with the reader's standard and units; null with a reason when there is none. */
export async function readerAnalysis(story: ReaderStory, query: AnalysisQueryInput, db: Knex = useDb()): Promise<{ analysis: AnalysisResponse | null, problem: string | null }> {
  const benchTest = toBenchTest(await benchTestOf(db, story.row.bench_test_id))
  try {
    const analysis = await runAnalysis(db, benchTest, { maxPoints: READER_CURVE_POINTS, ...query })
    return { analysis: withRoundedCurves(analysis, READER_CURVE_PLACES), problem: null }
  }
  catch (e) {
    const status = (e as { statusCode?: number }).statusCode
    if (status === 400) return { analysis: null, problem: (e as Error).message }
    throw e
  }
}

/** Pairs the results table already holds: each setup against the baseline and the setup before it. */
function comparisonsOf(analysis: AnalysisResponse | null): FigureComparison[] {
  if (!analysis) return []
  const rows = analysis.table.rows
  const out: FigureComparison[] = []
  rows.forEach((row, i) => {
    if (row.vsBaseline) out.push({ setupId: row.setupId, vsSetupId: analysis.baselineSetupId, gains: row.vsBaseline })
    const previous = rows[i - 1]
    if (row.vsPrevious && previous && previous.setupId !== analysis.baselineSetupId) out.push({ setupId: row.setupId, vsSetupId: previous.setupId, gains: row.vsPrevious })
  })
  return out
}

/** The figures' numbers in another correction standard (hp and lb-ft, which inline values need). */
export async function readerFigures(story: ReaderStory, standard: ReaderAnalysisInput['standard'], db: Knex = useDb()): Promise<Pick<StoryReaderView['figures'], 'analysis' | 'analysisProblem' | 'comparisons'>> {
  const { analysis, problem } = await readerAnalysis(story, { units: ANALYSIS_UNITS[0].id, ...(standard ? { standard } : {}) }, db)
  return { analysis, analysisProblem: problem, comparisons: comparisonsOf(analysis) }
}

// A published story's view is the same for every reader, and building it is most of
// a page's database work (eight queries and the analysis). Kept per process like the
// page cache, and dropped with it (invalidateStoryCache) when the stories change; the
// key carries the story's version as well, so an edit seen before the poll still misses.
const publishedViews = new LruCache<{ slug: string, storedAt: number, view: MagazineStoryResponse }>(200)

onStoryCacheDropped((slug) => {
  if (!slug) return publishedViews.clear()
  for (const key of publishedViews.keys()) {
    if (publishedViews.peek(key)?.slug === slug) publishedViews.delete(key)
  }
})

/** The story at this slug for this request's user, as GET /api/magazine/stories/<slug> answers. */
export async function readerStoryFor(event: H3Event, slug: string): Promise<MagazineStoryResponse> {
  const story = await findReaderStory(slug, await getCurrentUser(event))
  readerCacheHeaders(event, story)
  return readerView(story)
}

// The view exactly as JSON carries it (dates as strings), frozen once it is shared:
// server renders use the kept object itself, so nothing may change it in place.
const asJson = (view: MagazineStoryResponse): MagazineStoryResponse => JSON.parse(JSON.stringify(view))

export async function readerView(story: ReaderStory, db: Knex = useDb()): Promise<MagazineStoryResponse> {
  if (story.preview) return asJson(await buildReaderView(story, db))
  const key = `${story.row.id}:${story.row.version}:${new Date(story.row.updated_at).getTime()}`
  const kept = publishedViews.get(key)
  if (kept && Date.now() - kept.storedAt <= PAGE_CACHE_TTL_MS) return kept.view
  const view = deepFreeze(asJson(await buildReaderView(story, db)))
  publishedViews.set(key, { slug: story.row.slug, storedAt: Date.now(), view })
  return view
}

async function buildReaderView(story: ReaderStory, db: Knex): Promise<MagazineStoryResponse> {
  const { row } = story
  const benchRow = await benchTestOf(db, row.bench_test_id)
  const benchTest = toBenchTest(benchRow)
  // Hero first, then the body's photos in the order the text places them: the gallery's order.
  const photoIds = await usedPhotoIds(db, row)
  const [bylines, tags, photos, { analysis, problem }, buildSheet, setups] = await Promise.all([
    magazineBylines(db, [row.id]),
    magazineTags(db, [row.id]),
    magazinePhotos(db, photoIds),
    readerAnalysis(story, { units: ANALYSIS_UNITS[0].id }, db),
    getBuildSheet(db, benchTest.id),
    listSetups(db, benchTest.id),
  ])
  return {
    story: {
      id: row.id,
      slug: row.slug,
      headline: row.headline,
      deck: row.deck,
      bylines: bylines.get(row.id) ?? [],
      body: row.body,
      heroPhoto: (row.hero_photo_id ? photos.get(row.hero_photo_id) : undefined) ?? null,
      tags: tags.get(row.id) ?? [],
      engineFamily: row.engine_family,
      partType: row.part_type,
      searchTitle: row.search_title,
      searchDescription: row.search_description,
      state: row.state,
      publishedAt: row.published_at ? new Date(row.published_at).toISOString() : null,
      updatedAt: new Date(row.updated_at).toISOString(),
    },
    benchTest: { id: benchTest.id, title: benchTest.title, shop: benchTest.shop, dyno: benchTest.dyno, testedFrom: benchTest.testedFrom, testedTo: benchTest.testedTo },
    figures: {
      benchTestId: benchTest.id,
      analysis,
      analysisProblem: problem,
      comparisons: comparisonsOf(analysis),
      buildSheet,
      setups,
      photos: [...photos.values()],
      problems: [],
    },
    preview: story.preview,
    canonicalUrl: publicStoryUrl(row.slug),
    siteUrl: appConfig().baseUrl,
  }
}

/** Desk previews are private to the person looking; published answers may be kept by caches. */
export function readerCacheHeaders(event: H3Event, story: ReaderStory): void {
  if (story.preview) {
    setResponseHeader(event, 'Cache-Control', 'private, no-store')
    setResponseHeader(event, 'X-Robots-Tag', 'noindex, nofollow')
    event.context.pageCache = undefined
  }
}
