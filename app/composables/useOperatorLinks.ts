import type { CreatedOperatorLink, CreateOperatorLinkInput, OperatorLink } from '#shared/types/operator-links'

export const operatorLinksKey = (benchTestId: number) => `operator-links:${benchTestId}`

export function useOperatorLinks(benchTestId: MaybeRefOrGetter<number>) {
  return useFetch<{ links: OperatorLink[] }>(() => benchTestPath(toValue(benchTestId), '/operator-links'), {
    key: computed(() => operatorLinksKey(toValue(benchTestId))),
  })
}

export function useOperatorLinkActions(benchTestId: MaybeRefOrGetter<number>) {
  const refresh = () => refreshNuxtData(operatorLinksKey(toValue(benchTestId)))

  async function create(body: CreateOperatorLinkInput) {
    const res = await $fetch<CreatedOperatorLink>(benchTestPath(toValue(benchTestId), '/operator-links'), { method: 'POST', body })
    await refresh()
    return res
  }

  async function revoke(linkId: number) {
    const res = await $fetch<{ link: OperatorLink }>(benchTestPath(toValue(benchTestId), `/operator-links/${linkId}/revoke`), { method: 'POST' })
    await refresh()
    return res.link
  }

  return { create, revoke }
}
