import type { DeskQueueResponse, StoryListResponse } from '#shared/types/stories'

export const DESK_QUEUES = [
  { id: 'in_review', label: 'Waiting for review' },
  { id: 'changes_requested', label: 'Back with the writer' },
  { id: 'approved', label: 'Approved, not scheduled' },
  { id: 'scheduled', label: 'Scheduled' },
] as const
export type DeskQueueState = typeof DESK_QUEUES[number]['id']

/** Stories past the desk: the live ones (to withdraw) and the withdrawn ones (to reopen). */
export const DESK_SHELVES = [
  { id: 'published', label: 'Published' },
  { id: 'withdrawn', label: 'Withdrawn' },
] as const
export type DeskShelfState = typeof DESK_SHELVES[number]['id']

export const deskQueueKey = (state: DeskQueueState) => `desk-queue:${state}`
export const deskShelfKey = (state: DeskShelfState) => `desk-shelf:${state}`

/** Stories in one state of the desk, oldest waiting first, with how long each has waited. */
export function useDeskQueue(state: MaybeRefOrGetter<DeskQueueState>) {
  return useFetch<DeskQueueResponse>('/api/desk/queue', {
    key: computed(() => deskQueueKey(toValue(state))),
    query: computed(() => ({ state: toValue(state) })),
  })
}

/** Every story in a state (editors see all), newest change first. */
export function useDeskShelf(state: MaybeRefOrGetter<DeskShelfState>) {
  return useFetch<StoryListResponse>('/api/stories', {
    key: computed(() => deskShelfKey(toValue(state))),
    query: computed(() => ({ state: toValue(state) })),
  })
}
