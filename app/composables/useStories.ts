import type { CreateStoryInput, MyStoriesResponse, StoryResponse } from '#shared/types/stories'
import type { StoryState } from '#shared/types/story-workflow'

export const myStoriesKey = (state: StoryState | 'all') => `my-stories:${state}`

/** The caller's stories (bylines), newest change first, with a count per state. */
export function useMyStories(state: MaybeRefOrGetter<StoryState | 'all'>) {
  return useFetch<MyStoriesResponse>('/api/my/stories', {
    key: computed(() => myStoriesKey(toValue(state))),
    query: computed(() => (toValue(state) === 'all' ? {} : { state: toValue(state) })),
  })
}

export async function createStory(body: CreateStoryInput) {
  const res = await $fetch<StoryResponse>('/api/stories', { method: 'POST', body })
  return res.story
}
