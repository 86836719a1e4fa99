import type { Role } from '#shared/types/roles'
import { rolesAtLeast } from '#shared/accounts/roles'
import type { CurrentUser } from '#shared/types/users'

export interface MeResponse { user: CurrentUser | null }

/** The one cache entry for the signed-in user; every reader and writer uses this key. */
export const currentUserKey = () => 'current-user'

/**
 * Registers the fetch of GET /api/auth/me. The current-user plugin calls it once
 * per app start (on the server that is once per request), so the entry lives for
 * the whole app and refreshNuxtData(currentUserKey()) always reaches it. Calling
 * it again from every component would re-run the request during each server
 * render. On the server the render asks the services directly (RenderData).
 */
export function fetchCurrentUser() {
  const render = import.meta.server ? useRequestEvent()?.context.renderData : undefined
  return useAsyncData<MeResponse>(
    currentUserKey(),
    async () => (render ? { user: await render.currentUser() } : $fetch<MeResponse>('/api/auth/me')),
    { dedupe: 'defer' },
  )
}

export function useCurrentUser() {
  const { data } = useNuxtData<MeResponse>(currentUserKey())
  const user = computed<CurrentUser | null>(() => data.value?.user ?? null)

  /** True when the user holds `role` or a higher one. Hides UI only; the server decides. */
  function can(role: Role): boolean {
    return !!user.value && rolesAtLeast(role).includes(user.value.role)
  }

  return {
    user,
    signedIn: computed(() => user.value !== null),
    role: computed(() => user.value?.role ?? null),
    can,
  }
}

/** For route middleware: the user, fetching first if nothing has yet. */
export async function loadCurrentUser(): Promise<CurrentUser | null> {
  const { data } = useNuxtData<MeResponse>(currentUserKey())
  if (data.value === undefined) await fetchCurrentUser()
  return data.value?.user ?? null
}
