import type { MagazinePage } from '#shared/types/magazine'

export const magazineSearchKey = (q: string, page: number) => `magazine:search:${q}:${page}`
export const SEARCH_MIN_LENGTH = 2

/** Full-text search of published stories; nothing is asked for until the words are long enough. */
export async function useSearch(q: MaybeRefOrGetter<string>, page: MaybeRefOrGetter<number>) {
  const words = computed(() => toValue(q).trim())
  const ready = computed(() => words.value.length >= SEARCH_MIN_LENGTH)
  const result = await useAsyncData<(MagazinePage & { q: string }) | null>(
    () => magazineSearchKey(words.value, toValue(page)),
    () => ready.value
      ? $fetch<MagazinePage & { q: string }>('/api/magazine/search', { query: { q: words.value, page: toValue(page) } })
      : Promise.resolve(null),
    { watch: [words, () => toValue(page)] },
  )
  return { ...result, ready }
}
