import type { BenchTest, BenchTestDetail, UpdateBenchTestInput } from '#shared/types/bench-tests'
import type { BuildSheet, BuildSheetInput } from '#shared/types/build-sheets'

export const benchTestKey = (id: number) => `bench-test:${id}`

/** Fetches one bench test with its build sheet and live setups; the page shell calls it once. */
export function fetchBenchTest(id: MaybeRefOrGetter<number>) {
  return useFetch<BenchTestDetail>(() => benchTestPath(toValue(id)), {
    key: computed(() => benchTestKey(toValue(id))),
  })
}

/** The bench test the page shell fetched, for the sections under it. */
export function useBenchTest(id: MaybeRefOrGetter<number>) {
  const { data } = useNuxtData<BenchTestDetail>(benchTestKey(toValue(id)))
  return {
    detail: data,
    benchTest: computed(() => data.value?.benchTest ?? null),
    buildSheet: computed(() => data.value?.buildSheet ?? null),
    setups: computed(() => data.value?.setups ?? []),
    refresh: () => refreshNuxtData(benchTestKey(toValue(id))),
  }
}

/** A page under /bench-tests/[id]: the id from the route and the bench test the shell fetched. */
export function useBenchTestPage() {
  const route = useRoute()
  const id = computed(() => Number(route.params.id))
  return { id, ...useBenchTest(id) }
}

export function useBenchTestActions(id: MaybeRefOrGetter<number>) {
  const refresh = () => refreshNuxtData(benchTestKey(toValue(id)))

  async function update(body: UpdateBenchTestInput) {
    const res = await $fetch<{ benchTest: BenchTest }>(benchTestPath(toValue(id)), { method: 'PATCH', body })
    await Promise.all([refresh(), refreshBenchTestLists()])
    return res.benchTest
  }

  /** Soft delete; without confirm the server answers 409 with the pull counts first. */
  async function remove(confirm = false) {
    const res = await $fetch<{ benchTest: BenchTest }>(benchTestPath(toValue(id)), {
      method: 'DELETE',
      query: confirm ? { confirm: 'true' } : {},
    })
    await refreshBenchTestLists()
    return res.benchTest
  }

  async function saveBuildSheet(body: BuildSheetInput) {
    const res = await $fetch<{ buildSheet: BuildSheet }>(benchTestPath(toValue(id), '/build-sheet'), { method: 'PUT', body })
    await refresh()
    return res.buildSheet
  }

  return { update, remove, saveBuildSheet, refresh }
}
