import type { Ref } from 'vue'
import { apiStatus } from '~/utils/apiErrors'

/**
 * A page that shows its own words for a missing or withdrawn object (a preview link,
 * an operator's upload link) still answers with the API's status, 404 or 410, so
 * that crawlers, caches and monitors see what the person sees.
 */
export function useStatusFromError(error: Ref<unknown>): void {
  if (!import.meta.server) return
  const status = apiStatus(error.value)
  if (status !== 404 && status !== 410) return
  const event = useRequestEvent()
  if (event) setResponseStatus(event, status, status === 410 ? 'Gone' : 'Not Found')
}
