import type { CreatedPreviewLink, NumberCheckResult, PreviewLink, Story, StoryResponse, TransitionInput, TransitionResponse, TransitionListResponse, UpdateStoryInput } from '#shared/types/stories'

export const storyPath = (id: number, rest = '') => `/api/stories/${id}${rest}`
export const storyKey = (id: number) => `story:${id}`
export const storyTransitionsKey = (id: number) => `story-transitions:${id}`
export const previewLinksKey = (id: number) => `story-preview-links:${id}`
export const numberCheckKey = (id: number) => `story-number-check:${id}`

/** One story with what the caller may do to it (allowedActions, mayEdit) and its lock. */
export function fetchStory(id: MaybeRefOrGetter<number>) {
  return useFetch<StoryResponse>(() => storyPath(toValue(id)), {
    key: computed(() => storyKey(toValue(id))),
  })
}

/** Saves and state changes; the caller keeps the text it sent until the answer says it landed. */
export function useStoryActions(id: MaybeRefOrGetter<number>) {
  async function save(body: UpdateStoryInput): Promise<Story> {
    const res = await $fetch<StoryResponse>(storyPath(toValue(id)), { method: 'PATCH', body })
    return res.story
  }

  async function transition(body: TransitionInput): Promise<TransitionResponse> {
    const res = await $fetch<TransitionResponse>(storyPath(toValue(id), '/transitions'), { method: 'POST', body })
    await Promise.all([refreshNuxtData(storyKey(toValue(id))), refreshNuxtData(storyTransitionsKey(toValue(id)))])
    return res
  }

  return { save, transition }
}

/** The audit of a story's changes of state, oldest first. */
export function useStoryTransitions(id: MaybeRefOrGetter<number>) {
  return useFetch<TransitionListResponse>(() => storyPath(toValue(id), '/transitions'), {
    key: computed(() => storyTransitionsKey(toValue(id))),
  })
}

/**
 * The number check of the story as it is now. Opening it as an editor records it as
 * seen for this version (the approve guard reads that), so it is fetched on purpose,
 * not in the background.
 */
/** The number check; the desk runs it on opening, the editor when the writer asks (immediate: false). */
export function useStoryNumberCheck(id: MaybeRefOrGetter<number>, opts: { immediate?: boolean } = {}) {
  return useFetch<NumberCheckResult>(() => storyPath(toValue(id), '/number-check'), {
    key: computed(() => numberCheckKey(toValue(id))),
    server: false,
    immediate: opts.immediate ?? true,
    watch: opts.immediate === false ? false : undefined,
  })
}

export function useStoryPreviewLinks(id: MaybeRefOrGetter<number>) {
  const list = useFetch<{ links: PreviewLink[] }>(() => storyPath(toValue(id), '/preview-links'), {
    key: computed(() => previewLinksKey(toValue(id))),
    server: false,
  })
  async function create(body: { label?: string, expiresInHours?: number }) {
    const created = await $fetch<CreatedPreviewLink>(storyPath(toValue(id), '/preview-links'), { method: 'POST', body })
    await list.refresh()
    return created
  }
  async function revoke(linkId: number) {
    await $fetch(storyPath(toValue(id), `/preview-links/${linkId}/revoke`), { method: 'POST' })
    await list.refresh()
  }
  return { ...list, create, revoke }
}
