// The story editor's draft: the content fields as typed, what differs from the
// last saved state, and the copy kept in the browser when the network fails.
// Pure, so the rules of "what gets sent" and "what is worth offering back" are tested.
import type { Story, StoryContent } from '../types/stories'

export type StoryDraft = StoryContent

export const DRAFT_FIELDS = ['headline', 'deck', 'body', 'slug', 'heroPhotoId', 'tags', 'engineFamily', 'partType', 'searchTitle', 'searchDescription', 'bylineIds'] as const satisfies readonly (keyof StoryContent)[]
export type DraftField = typeof DRAFT_FIELDS[number]

export const DRAFT_FIELD_LABELS: Record<DraftField, string> = {
  headline: 'Headline', deck: 'Deck', body: 'Text', slug: 'Address (slug)', heroPhotoId: 'Hero photo', tags: 'Tags',
  engineFamily: 'Engine family', partType: 'Part type', searchTitle: 'Search title', searchDescription: 'Search description', bylineIds: 'Bylines',
}

export function draftOf(story: StoryContent): StoryDraft {
  return {
    headline: story.headline, deck: story.deck, body: story.body, slug: story.slug, heroPhotoId: story.heroPhotoId,
    tags: [...story.tags], engineFamily: story.engineFamily, partType: story.partType,
    searchTitle: story.searchTitle, searchDescription: story.searchDescription, bylineIds: [...story.bylineIds],
  }
}

function same(a: unknown, b: unknown): boolean {
  if (Array.isArray(a) && Array.isArray(b)) return a.length === b.length && a.every((v, i) => v === b[i])
  return a === b
}

/** The fields of `draft` that differ from `saved`. */
export function changedFields(draft: StoryDraft, saved: StoryDraft): DraftField[] {
  return DRAFT_FIELDS.filter(f => !same(draft[f], saved[f]))
}

/** The PATCH body for these fields, on top of the version read. */
export function patchBody(draft: StoryDraft, fields: readonly DraftField[], version: number, autosave: boolean): Record<string, unknown> {
  const body: Record<string, unknown> = { version }
  if (autosave) body.autosave = true
  for (const f of fields) body[f] = draft[f]
  return body
}

/** "cam, small block, dyno" -> ['cam', 'small block', 'dyno'] (the schema lowercases and drops repeats). */
export function tagsFromText(text: string): string[] {
  return text.split(',').map(t => t.trim()).filter(Boolean)
}

export function tagsToText(tags: readonly string[]): string {
  return tags.join(', ')
}

/** What the browser keeps when a save could not reach the server. */
export interface StoredDraftCopy {
  storyId: number
  /** The story version the text was based on. */
  baseVersion: number
  savedAt: string
  draft: StoryDraft
}

export const draftCopyKey = (storyId: number) => `pullsheet:story-copy:${storyId}`
export const draftAsideKey = (storyId: number) => `pullsheet:story-aside:${storyId}`

/** A stored copy read back defensively: anything malformed is no copy at all. */
export function parseDraftCopy(raw: string | null, storyId: number): StoredDraftCopy | null {
  if (!raw) return null
  try {
    const v = JSON.parse(raw) as Partial<StoredDraftCopy>
    const d = v.draft as Partial<StoryDraft> | undefined
    if (v.storyId !== storyId || typeof v.baseVersion !== 'number' || typeof v.savedAt !== 'string' || !d) return null
    if (typeof d.headline !== 'string' || typeof d.body !== 'string' || !Array.isArray(d.tags) || !Array.isArray(d.bylineIds)) return null
    return v as StoredDraftCopy
  }
  catch {
    return null
  }
}

/** Worth offering back: the copy says something the story on the server does not. */
export function copyDiffers(copy: StoredDraftCopy, story: Story | StoryContent): boolean {
  return changedFields(copy.draft, draftOf(story)).length > 0
}

/** Everything typed, as plain text for the clipboard ("copy mine aside"). */
export function draftAsText(draft: StoryDraft): string {
  return [
    `Headline: ${draft.headline}`,
    `Deck: ${draft.deck}`,
    `Slug: ${draft.slug}`,
    `Tags: ${tagsToText(draft.tags)}`,
    `Search title: ${draft.searchTitle}`,
    `Search description: ${draft.searchDescription}`,
    '',
    draft.body,
  ].join('\n')
}
