import type { MagazineHome, MagazinePage } from '#shared/types/magazine'
import { formatTime } from '#shared/utils/time-text'

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

/** "14 May 2026", the day in the magazine's time zone (the shared time text). */
export function formatPublished(iso: string | null, timeZone: string): string {
  return iso ? formatTime(iso, timeZone, { dateOnly: true }) : ''
}
