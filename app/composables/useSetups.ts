import type { CreateSetupInput, IdleCheck, IdleCheckInput, Setup, UpdateSetupInput } from '#shared/types/setups'

export const deletedSetupsKey = (benchTestId: number) => `setups-deleted:${benchTestId}`

export function useDeletedSetups(benchTestId: MaybeRefOrGetter<number>) {
  return useFetch<{ setups: Setup[] }>(() => benchTestPath(toValue(benchTestId), '/setups'), {
    key: computed(() => deletedSetupsKey(toValue(benchTestId))),
    query: { deleted: 'only' },
  })
}

/** Every change to setups also changes the pulls, analysis and bench test views. */
export function useSetupActions(benchTestId: MaybeRefOrGetter<number>) {
  const id = () => toValue(benchTestId)
  const path = (rest = '') => benchTestPath(id(), `/setups${rest}`)
  const refresh = () => refreshNuxtData([benchTestKey(id()), deletedSetupsKey(id()), pullsKey(id())])

  async function create(body: CreateSetupInput) {
    const res = await $fetch<{ setup: Setup }>(path(), { method: 'POST', body })
    await refresh()
    return res.setup
  }

  async function update(setupId: number, body: UpdateSetupInput) {
    const res = await $fetch<{ setup: Setup }>(path(`/${setupId}`), { method: 'PATCH', body })
    await refresh()
    return res.setup
  }

  async function remove(setupId: number, confirm = false) {
    const res = await $fetch<{ setup: Setup }>(path(`/${setupId}`), { method: 'DELETE', query: confirm ? { confirm: 'true' } : {} })
    await refresh()
    return res.setup
  }

  async function restore(setupId: number) {
    const res = await $fetch<{ setup: Setup }>(path(`/${setupId}/restore`), { method: 'POST' })
    await refresh()
    return res.setup
  }

  async function makeBaseline(setupId: number) {
    await $fetch<{ setups: Setup[] }>(path(`/${setupId}/baseline`), { method: 'POST' })
    await refresh()
  }

  async function reorder(setupIds: number[]) {
    await $fetch<{ setups: Setup[] }>(path('/order'), { method: 'PUT', body: { setupIds } })
    await refresh()
  }

  async function addIdleCheck(setupId: number, body: IdleCheckInput) {
    const res = await $fetch<{ idleCheck: IdleCheck }>(path(`/${setupId}/idle-checks`), { method: 'POST', body })
    await refresh()
    return res.idleCheck
  }

  async function removeIdleCheck(setupId: number, checkId: number) {
    await $fetch(path(`/${setupId}/idle-checks/${checkId}`), { method: 'DELETE' })
    await refresh()
  }

  return { create, update, remove, restore, makeBaseline, reorder, addIdleCheck, removeIdleCheck }
}
