import type { MagazineHome, MagazinePage } from '#shared/types/magazine'

export const magazineHomeKey = () => 'magazine:home'
export const magazineListKey = (path: string, page: number) => `magazine:list:${path}:${page}`

/** The front page: featured, latest and what there is to browse. */
export function useMagazineHome() {
  return useFetch<MagazineHome>('/api/magazine/home', { key: magazineHomeKey() })
}

/** One page of a list of published stories (latest, an engine family, a part type, a tag). */
export function useMagazineList(path: MaybeRefOrGetter<string>, page: MaybeRefOrGetter<number>) {
  return useFetch<MagazinePage>(() => toValue(path), {
    key: computed(() => magazineListKey(toValue(path), toValue(page))),
    query: computed(() => ({ page: toValue(page) })),
  })
}

/** ?page=N of the current route, 1 when absent or nonsense. */
export function usePageNumber() {
  const route = useRoute()
  return computed(() => {
    const n = Number(route.query.page)
    return Number.isInteger(n) && n >= 1 && n <= 1000 ? n : 1
  })
}

// One locale and zone so the server render and the browser print the same date.
const PUBLISHED = new Intl.DateTimeFormat('en-GB', { day: 'numeric', month: 'long', year: 'numeric', timeZone: 'UTC' })

/** "14 May 2026" */
export function formatPublished(iso: string | null): string {
  if (!iso) return ''
  const date = new Date(iso)
  return Number.isNaN(date.getTime()) ? iso : PUBLISHED.format(date)
}
