import { rolesAtLeast } from '#shared/accounts/roles'
import { loadCurrentUser } from '~/composables/useCurrentUser'

// Shapes navigation only: every API route checks the role again on the server.
export default defineNuxtRouteMiddleware(async (to) => {
  // The server already ran this check for the page it rendered (and showed its
  // error page if it refused); running it again while hydrating only repeats that.
  const nuxtApp = useNuxtApp()
  if (import.meta.client && nuxtApp.isHydrating && nuxtApp.payload.serverRendered) return

  const required = to.meta.requiredRole ?? 'reader'
  const user = await loadCurrentUser()
  if (!user) {
    return navigateTo({ path: '/login', query: { next: to.fullPath } })
  }
  if (!rolesAtLeast(required).includes(user.role)) {
    // Fatal only in the browser, where a non-fatal error would just cancel the
    // navigation; on the server any error renders the error page.
    return abortNavigation(createError({ status: 403, statusText: 'Forbidden', fatal: import.meta.client }))
  }
})
