import type { RevisionComparison, RevisionListResponse, StoryResponse } from '#shared/types/stories'

export const revisionsKey = (storyId: number) => `story-revisions:${storyId}`

export function useRevisions(storyId: MaybeRefOrGetter<number>) {
  const list = useFetch<RevisionListResponse>(() => storyPath(toValue(storyId), '/revisions'), {
    key: computed(() => revisionsKey(toValue(storyId))),
    server: false,
  })

  function compare(from: number, to: number) {
    return $fetch<RevisionComparison>(storyPath(toValue(storyId), '/revisions/compare'), { query: { from, to } })
  }

  return { ...list, compare }
}

/** Puts a revision's content back as the story (a new version); 409 when `version` is stale. */
export async function restoreStoryRevision(storyId: number, revisionId: number, version: number) {
  const res = await $fetch<StoryResponse>(storyPath(storyId, `/revisions/${revisionId}/restore`), { method: 'POST', body: { version } })
  return res.story
}
