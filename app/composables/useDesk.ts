import type { DeskQueueResponse } from '#shared/types/stories'

export const DESK_QUEUES = [
  { id: 'in_review', label: 'Waiting for review' },
  { id: 'changes_requested', label: 'Back with the writer' },
  { id: 'approved', label: 'Approved, not scheduled' },
  { id: 'scheduled', label: 'Scheduled' },
] as const
export type DeskQueueState = typeof DESK_QUEUES[number]['id']

export const deskQueueKey = (state: DeskQueueState) => `desk-queue:${state}`

/** Stories in one state of the desk, oldest waiting first, with how long each has waited. */
export function useDeskQueue(state: MaybeRefOrGetter<DeskQueueState>) {
  return useFetch<DeskQueueResponse>('/api/desk/queue', {
    key: computed(() => deskQueueKey(toValue(state))),
    query: computed(() => ({ state: toValue(state) })),
  })
}
