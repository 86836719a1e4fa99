import type { PhotoGallery } from '#shared/types/photos'

export const photoGalleryKey = (benchTestId: number) => `photo-gallery:${benchTestId}`

/** The photos of one bench test, in gallery order; every reader and writer of it uses this key. */
export function usePhotoGallery(benchTestId: MaybeRefOrGetter<number>) {
  return useFetch<PhotoGallery>(() => `/api/bench-tests/${toValue(benchTestId)}/photos`, {
    key: computed(() => photoGalleryKey(toValue(benchTestId))),
  })
}

export function refreshPhotoGallery(benchTestId: number) {
  return refreshNuxtData(photoGalleryKey(benchTestId))
}
