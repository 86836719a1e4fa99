import type { PullList, PullSummary, UpdatePullInput } from '#shared/types/pulls'

export const pullsKey = (benchTestId: number) => `pulls:${benchTestId}`

export function usePulls(benchTestId: MaybeRefOrGetter<number>) {
  return useFetch<PullList>(() => benchTestPath(toValue(benchTestId), '/pulls'), {
    key: computed(() => pullsKey(toValue(benchTestId))),
  })
}

/** After pulls change, the lists, counts and analysis of the bench test change too. */
export function refreshAfterPulls(benchTestId: number) {
  return refreshNuxtDataWhere(key => key === pullsKey(benchTestId) || key === benchTestKey(benchTestId) || key.startsWith(`analysis:${benchTestId}:`))
}

export function usePullActions(benchTestId: MaybeRefOrGetter<number>) {
  async function update(pullId: number, body: UpdatePullInput) {
    const id = toValue(benchTestId)
    const res = await $fetch<{ pull: PullSummary }>(benchTestPath(id, `/pulls/${pullId}`), { method: 'PATCH', body })
    await refreshAfterPulls(id)
    return res.pull
  }
  return { update }
}
