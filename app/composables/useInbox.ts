import type { AssignInboxInput, InboxFile, InboxState } from '#shared/types/inbox'
import type { PullFilePreview } from '#shared/types/pull-imports'
import type { PullSummary } from '#shared/types/pulls'
import type { ColumnRole } from '#shared/dyno'
import type { ProposalSource } from '#shared/utils/setup-proposal'
import type { WeatherDraft } from './usePullImport'

/** What the writer has chosen for one waiting file before assigning it. */
export interface InboxDraft {
  selected: boolean
  setupId: number | null
  setupSource: ProposalSource | null
  weather: WeatherDraft
  dynoCorrected: boolean
  mapping: Record<string, ColumnRole>
  preview: PullFilePreview
  errors: Record<string, string>
}

export const inboxKey = (benchTestId: number, state: InboxState) => `inbox:${benchTestId}:${state}`

export function useInbox(benchTestId: MaybeRefOrGetter<number>, state: MaybeRefOrGetter<InboxState> = 'waiting') {
  return useFetch<{ files: InboxFile[] }>(() => benchTestPath(toValue(benchTestId), '/inbox'), {
    key: computed(() => inboxKey(toValue(benchTestId), toValue(state))),
    query: computed(() => ({ state: toValue(state) })),
  })
}

export function useInboxActions(benchTestId: MaybeRefOrGetter<number>) {
  const id = () => toValue(benchTestId)
  // The bench test list carries the count of waiting files (the section link's badge).
  const refresh = () => refreshNuxtDataWhere(key => key.startsWith(`inbox:${id()}:`) || key === operatorLinksKey(id()) || key.startsWith('bench-tests:'))

  async function preview(fileId: number, mapping?: Record<string, ColumnRole>) {
    const res = await $fetch<{ preview: PullFilePreview }>(benchTestPath(id(), `/inbox/${fileId}/preview`), { method: 'POST', body: { mapping } })
    return res.preview
  }

  async function assign(body: AssignInboxInput) {
    const res = await $fetch<{ pulls: PullSummary[] }>(benchTestPath(id(), '/inbox/assign'), { method: 'POST', body })
    await Promise.all([refresh(), refreshAfterPulls(id())])
    return res.pulls
  }

  async function dismiss(fileId: number) {
    const res = await $fetch<{ file: InboxFile }>(benchTestPath(id(), `/inbox/${fileId}/dismiss`), { method: 'POST' })
    await refresh()
    return res.file
  }

  return { preview, assign, dismiss }
}
