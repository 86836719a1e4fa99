import type { DayAction, DayView, SavePlanInput, TestPlan } from '#shared/types/dyno-day'

export const testPlanKey = (id: number) => `test-plan:${id}`
export const dayViewKey = (id: number) => `dyno-day:${id}`

export function useTestPlan(benchTestId: MaybeRefOrGetter<number>) {
  return useFetch<{ plan: TestPlan }>(() => benchTestPath(toValue(benchTestId), '/plan'), { key: computed(() => testPlanKey(toValue(benchTestId))) })
}

export function useDayView(benchTestId: MaybeRefOrGetter<number>) {
  return useFetch<DayView>(() => benchTestPath(toValue(benchTestId), '/day'), { key: computed(() => dayViewKey(toValue(benchTestId))) })
}

export function useTestPlanActions(benchTestId: MaybeRefOrGetter<number>) {
  const id = () => toValue(benchTestId)
  const after = () => Promise.all([refreshNuxtData(testPlanKey(id())), refreshNuxtData(dayViewKey(id())), refreshNuxtData(benchTestKey(id()))])
  async function save(body: SavePlanInput) {
    const res = await $fetch<{ plan: TestPlan }>(benchTestPath(id(), '/plan'), { method: 'PUT', body })
    await after()
    return res.plan
  }
  async function copyFrom(fromBenchTestId: number, version: number) {
    const res = await $fetch<{ plan: TestPlan }>(benchTestPath(id(), '/plan/copy'), { method: 'POST', body: { fromBenchTestId, version } })
    await after()
    return res.plan
  }
  async function act(action: DayAction) {
    const res = await $fetch<{ plan: TestPlan }>(benchTestPath(id(), '/plan/day'), { method: 'POST', body: action })
    await after()
    return res.plan
  }
  return { save, copyFrom, act }
}

export type LiveState = 'connecting' | 'live' | 'reconnecting' | 'off'

/**
 * Follows the bench test's change counter over server-sent events and calls `onChange`
 * when it moves past what the page shows. EventSource reconnects by itself with
 * Last-Event-ID; the server then sends the counter at once if anything was missed.
 */
export function useDayLive(benchTestId: MaybeRefOrGetter<number>, shownSeq: () => number | undefined, onChange: () => unknown) {
  const state = ref<LiveState>('off')
  const lastEventAt = ref<number | null>(null)
  let source: EventSource | null = null
  onMounted(() => {
    if (typeof EventSource === 'undefined') return
    state.value = 'connecting'
    source = new EventSource(benchTestPath(toValue(benchTestId), '/day/events'))
    source.addEventListener('open', () => { state.value = 'live' })
    source.addEventListener('error', () => { state.value = source?.readyState === EventSource.CLOSED ? 'off' : 'reconnecting' })
    source.addEventListener('change', (e) => {
      state.value = 'live'
      lastEventAt.value = Date.now()
      const seq = Number(JSON.parse((e as MessageEvent<string>).data).seq)
      if (seq !== shownSeq()) void onChange()
    })
  })
  onBeforeUnmount(() => {
    source?.close()
    source = null
  })
  return { state, lastEventAt }
}
