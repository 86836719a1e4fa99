// Where figure exports, social cards and embeds read a story from: the one place
// that knows the story view's shape. Published stories come from the reader's view
// (what readers see, cached per process); the desk's exports of a story at any
// state come from the story's current text and figures. When a story's published
// figures move into frozen editions, only this file changes.
import type { H3Event } from 'h3'
import type { StoryFigures, StoryReaderView } from '#shared/types/stories'
import type { CurrentUser } from '#shared/types/users'

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
   * Names exactly what the figures are drawn from: a new key whenever anything a
   * reader could see changes. Cached drawings (social cards) are kept under it.
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

const keyOf = (row: { id: number, version: number, updated_at: Date | string }) => `${row.id}-${row.version}-${new Date(row.updated_at).getTime()}`

/**
 * The story at this slug as the caller may read it (published; the desk also sees
 * its unpublished stories, marked as preview): 404/410 otherwise, as the page.
 */
export async function readerFigureStory(event: H3Event, slug: string): Promise<FigureStory> {
  const story = await findReaderStory(slug, await getCurrentUser(event))
  readerCacheHeaders(event, story)
  return fromView(await readerView(story), keyOf(story.row))
}

/** The story's current text and figures, for its desk (bylines, editors, admins): 404 for anyone else. */
export async function deskFigureStory(user: CurrentUser, storyId: number): Promise<FigureStory> {
  const db = useDb()
  const row = await requireStoryRow(db, user, storyId)
  const view = await storyReaderView(db, row, { preview: row.state !== 'published' })
  return fromView(view, keyOf(row))
}
