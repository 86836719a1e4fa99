// Where figure exports, social cards and embeds read a story from: the one place
// that knows the story view's shape. Everything is drawn from an edition whenever
// the story has one that counts: the published edition for readers and for the
// desk's exports of a published story, the approved edition for the desk's exports
// of an approved or scheduled story. Only a story still being written (draft, in
// review, sent back) is drawn from the workspace as it is now.
import type { H3Event } from 'h3'
import type { Db } from '../../utils/db'
import type { StoryFigures, StoryReaderView } from '#shared/types/stories'
import type { CurrentUser } from '#shared/types/users'
import type { ReaderStory } from '../magazine/story'
import { editionView, findReaderStory, readerCacheHeaders, readerView } from '../magazine/story'
import { latestEdition } from '../stories/editions'
import { storyReaderView } from '../stories/figures'
import { requireStoryRow } from '../stories/stories'

export interface FigureStory {
  id: number
  slug: string
  headline: string
  deck: string
  bylines: string[]
  publishedAt: string | null
  updatedAt: string
  body: string
  figures: StoryFigures
  /** Photo ids the story uses: the hero first, then the body's order. */
  photoIds: number[]
  /**
   * Names exactly what the figures are drawn from: the edition (never changes), or
   * for a story without one the row's version. Cached drawings (social cards) are
   * kept under it.
   */
  editionKey: string
  /** True when the story is not published (the desk looking at its own work). */
  preview: boolean
}

function fromView(view: StoryReaderView, editionKey: string): FigureStory {
  const { story } = view
  return {
    id: story.id,
    slug: story.slug,
    headline: story.headline,
    deck: story.deck,
    bylines: story.bylines.map(b => b.displayName),
    publishedAt: story.publishedAt,
    updatedAt: story.updatedAt,
    body: story.body,
    figures: view.figures,
    photoIds: [...new Set([story.heroPhoto?.id, ...view.figures.photos.map(p => p.id)].filter((id): id is number => typeof id === 'number'))],
    editionKey,
    preview: view.preview,
  }
}

const rowKey = (row: { id: number, version: number, updated_at: Date | string }) => `${row.id}-${row.version}-${new Date(row.updated_at).getTime()}`
// The time keeps keys apart across databases that reuse story ids (a reset demo, one bucket).
const editionKey = (storyId: number, edition: { number: number, at: string }) => `${storyId}-edition-${edition.number}-${new Date(edition.at).getTime()}`

function publishedKey(story: ReaderStory, view: StoryReaderView): string {
  return view.edition?.publishedAt ? editionKey(story.row.id, { number: view.edition.number, at: view.edition.publishedAt }) : rowKey(story.row)
}

/**
 * The story at this slug as the caller may read it (published; the desk also sees
 * its unpublished stories, marked as preview): 404/410 otherwise, as the page.
 */
export async function readerFigureStory(db: Db, event: H3Event, slug: string): Promise<FigureStory> {
  const story = await findReaderStory(db, slug, await getCurrentUser(event))
  readerCacheHeaders(event, story)
  const view = await readerView(db, story)
  return fromView(view, publishedKey(story, view))
}

/** The story's figures for its desk (bylines, editors, admins): 404 for anyone else. */
export async function deskFigureStory(db: Db, user: CurrentUser, storyId: number): Promise<FigureStory> {
  const row = await requireStoryRow(db, user, storyId)
  const story = await findReaderStory(db, row.slug, user)
  if (!story.preview) {
    const view = await readerView(db, story)
    return fromView(view, publishedKey(story, view))
  }
  if (row.state === 'approved' || row.state === 'scheduled') {
    const approved = await latestEdition(db, row.id)
    if (approved) return fromView(await editionView(db, story, approved), editionKey(row.id, { number: approved.number, at: approved.approvedAt }))
  }
  const view = await storyReaderView(db, row, { preview: true })
  return fromView(view, rowKey(row))
}
