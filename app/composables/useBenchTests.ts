import type { BenchTest, BenchTestSummary, CreateBenchTestInput } from '#shared/types/bench-tests'

export const benchTestsKey = (deleted: boolean, q = '') => `bench-tests:${deleted ? 'deleted' : 'live'}:${q}`

/** The bench tests the server lets this user see (writers their own, editors all). */
export function useBenchTests(options: { deleted?: boolean, q?: Ref<string> } = {}) {
  const q = options.q ?? ref('')
  return useFetch<{ benchTests: BenchTestSummary[] }>('/api/bench-tests', {
    key: computed(() => benchTestsKey(!!options.deleted, q.value.trim())),
    query: computed(() => ({
      ...(options.deleted ? { deleted: 'only' } : {}),
      ...(q.value.trim() ? { q: q.value.trim() } : {}),
    })),
  })
}

export function refreshBenchTestLists() {
  return refreshNuxtDataWhere(key => key.startsWith('bench-tests:'))
}

export function useBenchTestsActions() {
  async function create(body: CreateBenchTestInput) {
    const res = await $fetch<{ benchTest: BenchTest }>('/api/bench-tests', { method: 'POST', body })
    await refreshBenchTestLists()
    return res.benchTest
  }

  async function restore(id: number) {
    const res = await $fetch<{ benchTest: BenchTest }>(benchTestPath(id, '/restore'), { method: 'POST' })
    // Not awaited: the caller moves on to the restored bench test, and awaiting a
    // refresh of the list it is leaving was seen to stall that navigation.
    void refreshBenchTestLists()
    return res.benchTest
  }

  return { create, restore }
}
