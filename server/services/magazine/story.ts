// One story as a reader sees it: published only. A withdrawn story answers 410
// (it was here and is gone on purpose); anything else unpublished is 404, except
// for the desk (its bylines, editors and admins), who see it marked as a preview.
import type { H3Event } from 'h3'
import type { Db } from '../../utils/db'
import type { z } from 'zod'
import { AnalysisQuery, type AnalysisQueryInput, type AnalysisResponse } from '#shared/types/analysis-results'
import type { ReaderEdition, StoryFigures, StoryReaderView } from '#shared/types/stories'
import type { StoryData, StoryEditionSummary } from '#shared/types/story-data'
import type { MagazineStoryResponse } from '#shared/types/magazine'
import type { CurrentUser } from '#shared/types/users'
import type { EngineFamily, PartType } from '#shared/types/catalog'
import { rolesAtLeast } from '#shared/accounts/roles'
import { gainPairsShown } from '#shared/utils/story-view'
import { deepFreeze } from '#shared/utils/deep-freeze'
import { LruCache } from '#shared/utils/lru-cache'
import type { StoryRow as StoryRowFull } from '../stories/stories'
import type { Edition } from '../stories/editions'
import { publicStoryUrl } from './feeds'
import { magazineBylines, magazinePhotos, magazineTags } from './lists'
import { figuresOf, listEditions, liveStoryData, publishedEdition, publishLatestEdition, storyDataHash } from '../stories/editions'

/** The reader's switches: correction standard and units (figures in the text stay in hp and lb-ft). */
export const ReaderAnalysisQuery = AnalysisQuery.pick({ standard: true, units: true })
export type ReaderAnalysisInput = z.infer<typeof ReaderAnalysisQuery>

/** The whole stories row, with the catalog values and the state narrowed for readers. */
type StoryRow = Omit<StoryRowFull, 'engine_family' | 'part_type' | 'state'> & {
  engine_family: EngineFamily
  part_type: PartType
  state: StoryReaderView['story']['state']
}

export interface ReaderStory { row: StoryRow, preview: boolean }

async function mayPreview(db: Db, user: CurrentUser | null, storyId: number): Promise<boolean> {
  if (!user) return false
  if (user.role === 'editor' || user.role === 'admin') return true
  if (!rolesAtLeast('writer').includes(user.role)) return false
  return Boolean(await db('story_bylines').where({ story_id: storyId, user_id: user.id }).first('user_id'))
}

/** The story for this slug as the caller may read it, or the 404/410 a reader gets. */
export async function findReaderStory(db: Db, slug: string, user: CurrentUser | null): Promise<ReaderStory> {
  const row = await db<StoryRow>('stories').where({ slug }).first()
  if (!row) notFound('No such story.')
  if (row.state === 'published') return { row, preview: false }
  if (await mayPreview(db, user, row.id)) return { row, preview: true }
  if (row.state === 'withdrawn') throw createError({ statusCode: 410, statusMessage: 'Gone', message: 'This story was withdrawn by the editors.' })
  notFound('No such story.')
}

/** The data and text a reader's page is built from: the published edition, or for a desk preview the live story. */
export interface ReaderSource {
  data: StoryData
  hash: string
  text: { headline: string, deck: string, body: string }
  edition: Edition | null
}

async function freezeMissingEdition(db: Db, row: StoryRow): Promise<Edition> {
  // A story put live before editions existed (or by hand): its edition is frozen the
  // first time a reader asks, once; a second server asking at the same moment loses
  // the unique key and reads the winner's.
  try {
    await db.transaction(async (trx) => {
      const locked = await trx<StoryRowFull>('stories').where({ id: row.id }).forUpdate().first()
      if (!locked || await trx('story_editions').where('story_id', row.id).first('id')) return
      await publishLatestEdition(trx, locked, null)
    })
  }
  catch (e) {
    if ((e as { code?: string }).code !== 'ER_DUP_ENTRY') throw e
  }
  const edition = await publishedEdition(db, row.id)
  if (!edition) notFound('No such story.')
  return edition
}

export async function readerSource(db: Db, story: ReaderStory): Promise<ReaderSource> {
  const { row } = story
  if (story.preview) {
    const data = await liveStoryData(db, row)
    return { data, hash: storyDataHash(data), text: row, edition: null }
  }
  const edition = await publishedEdition(db, row.id) ?? await freezeMissingEdition(db, row)
  return { data: edition.data, hash: edition.contentHash, text: edition, edition }
}

/** The story's analysis with the reader's standard and units; null with a reason when there is none. */
export async function readerAnalysis(db: Db, story: ReaderStory, query: AnalysisQueryInput): Promise<{ analysis: AnalysisResponse | null, problem: string | null, source: ReaderSource }> {
  const source = await readerSource(db, story)
  const figures = figuresOf(source.data, source.hash, { standard: query.standard, units: query.units, photos: [] })
  return { analysis: figures.analysis, problem: figures.analysisProblem, source }
}

/** The figures' numbers in another correction standard and units (graphs and tables; prose keeps the edition's). */
export async function readerFigures(db: Db, story: ReaderStory, query: ReaderAnalysisInput): Promise<Pick<StoryReaderView['figures'], 'analysis' | 'analysisProblem' | 'comparisons'>> {
  const { analysis, problem, source } = await readerAnalysis(db, story, query)
  const comparisons = analysis ? figuresOf(source.data, source.hash, { standard: query.standard, units: query.units, photos: [] }).comparisons : []
  return { analysis, analysisProblem: problem, comparisons }
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
export async function readerStoryFor(db: Db, event: H3Event, slug: string): Promise<MagazineStoryResponse> {
  const story = await findReaderStory(db, slug, await getCurrentUser(event))
  readerCacheHeaders(event, story)
  return readerView(db, story)
}

// The view exactly as JSON carries it (dates as strings), frozen once it is shared:
// server renders use the kept object itself, so nothing may change it in place.
const asJson = (view: MagazineStoryResponse): MagazineStoryResponse => JSON.parse(JSON.stringify(view))

export async function readerView(db: Db, story: ReaderStory): Promise<MagazineStoryResponse> {
  if (story.preview) return asJson(await buildReaderView(story, db))
  const key = `${story.row.id}:${story.row.version}:${new Date(story.row.updated_at).getTime()}`
  const kept = publishedViews.get(key)
  if (kept && Date.now() - kept.storedAt <= PAGE_CACHE_TTL_MS) return kept.view
  const view = deepFreeze(asJson(await buildReaderView(story, db)))
  publishedViews.set(key, { slug: story.row.slug, storedAt: Date.now(), view })
  return view
}

/**
 * The page's view of one given edition: the desk's exports of an approved or
 * scheduled story draw what was approved, not the workspace as it is now.
 */
export async function editionView(db: Db, story: ReaderStory, edition: Edition): Promise<MagazineStoryResponse> {
  return asJson(await buildReaderView(story, db, { data: edition.data, hash: edition.contentHash, text: edition, edition }))
}

async function buildReaderView(story: ReaderStory, db: Db, given?: ReaderSource): Promise<MagazineStoryResponse> {
  const { row } = story
  const source = given ?? await readerSource(db, story)
  const { data, text, edition } = source
  // Hero first, then the body's photos in the order the text places them: the gallery's order.
  const [bylines, tags, photos, editions] = await Promise.all([
    magazineBylines(db, [row.id]),
    magazineTags(db, [row.id]),
    magazinePhotos(db, data.photoIds),
    edition ? listEditions(db, row.id) : Promise.resolve([]),
  ])
  const figures = figuresOf(data, source.hash, { photos: [...photos.values()] })
  // What the edition froze; an edition from before these were kept leaves the row's.
  const heroId = edition && edition.heroPhotoId !== undefined ? edition.heroPhotoId : row.hero_photo_id
  return {
    story: {
      id: row.id,
      slug: row.slug,
      headline: text.headline,
      deck: text.deck,
      bylines: bylines.get(row.id) ?? [],
      body: text.body,
      heroPhoto: (heroId && data.photoIds.includes(heroId) ? photos.get(heroId) : undefined) ?? null,
      tags: tags.get(row.id) ?? [],
      engineFamily: row.engine_family,
      partType: row.part_type,
      searchTitle: edition?.searchTitle ?? row.search_title,
      searchDescription: edition?.searchDescription ?? row.search_description,
      state: row.state,
      publishedAt: row.published_at ? new Date(row.published_at).toISOString() : null,
      updatedAt: new Date(row.updated_at).toISOString(),
    },
    benchTest: data.benchTest,
    figures: readerFiguresOnly(figures, text.body),
    edition: edition ? editionNotice(edition, editions) : null,
    preview: story.preview,
    canonicalUrl: publicStoryUrl(row.slug),
    siteUrl: appConfig().baseUrl,
  }
}

/** What a reader's page carries: every pair's numbers, but only the gain curves its graphs draw. */
function readerFiguresOnly(figures: StoryFigures, body: string): StoryFigures {
  const a = figures.analysis
  if (!a) return figures
  const shown = gainPairsShown(body, a)
  return { ...figures, analysis: { ...a, gains: a.gains.filter(g => shown.has(`${g.setupId}:${g.againstSetupId}`)) } }
}

function editionNotice(edition: Edition, editions: StoryEditionSummary[]): ReaderEdition {
  return {
    number: edition.number,
    publishedAt: edition.publishedAt,
    corrections: editions.filter(e => e.publishedAt && e.correctionNote && e.number <= edition.number)
      .map(e => ({ number: e.number, at: e.publishedAt!, note: e.correctionNote })),
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
