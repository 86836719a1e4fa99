import type { DeleteConfirmData, StaleVersionData } from '#shared/types/workspace'
import { apiStatus } from '~/utils/apiErrors'

// The `data` an error answer carried (409 stale version, 409 delete confirm, 422
// refused import...). $fetch puts the response body on err.data; the server's
// own payload sits one level further in, under body.data.
export function apiErrorData<T>(err: unknown): T | undefined {
  if (!err || typeof err !== 'object') return undefined
  const body = (err as { data?: unknown }).data
  if (!body || typeof body !== 'object') return undefined
  const inner = (body as { data?: unknown }).data
  return inner && typeof inner === 'object' ? inner as T : undefined
}

/** The row as it is now, when a save was refused for a stale version. */
export function staleVersionOf<T>(err: unknown): StaleVersionData<T> | undefined {
  if (apiStatus(err) !== 409) return undefined
  const data = apiErrorData<StaleVersionData<T>>(err)
  return data && typeof data.currentVersion === 'number' && data.current ? data : undefined
}

/** The counts the server wants confirmed before something with pulls is deleted. */
export function deleteConfirmOf(err: unknown): DeleteConfirmData | undefined {
  if (apiStatus(err) !== 409) return undefined
  const data = apiErrorData<DeleteConfirmData>(err)
  return data && typeof data.pulls === 'number' && typeof data.message === 'string' ? data : undefined
}

export const benchTestPath = (id: number, rest = '') => `/api/bench-tests/${id}${rest}`

/**
 * refreshNuxtData for every fetched entry whose key matches (e.g. all analyses of one
 * bench test). The keys come from the payload, Nuxt's public record of fetched data.
 */
export function refreshNuxtDataWhere(match: (key: string) => boolean) {
  const keys = Object.keys(useNuxtApp().payload.data).filter(match)
  return keys.length ? refreshNuxtData(keys) : Promise.resolve()
}
