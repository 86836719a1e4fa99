import { STAFF_COLLECTIONS } from '#shared/types/content'
import { rolesAtLeast } from '#shared/accounts/roles'

// The content module serves every collection under /__nuxt_content/<collection>/
// (its SQL dump for the browser's own database, and a query route). Collections for
// the desk answer 404 to anyone who is not on it, as if they were not there; pages
// and the browser reach them with the visitor's session cookie.
const DESK = rolesAtLeast('writer')

export default defineEventHandler(async (event) => {
  if (!event.path.startsWith('/__nuxt_content/')) return
  const segment = event.path.slice('/__nuxt_content/'.length).split(/[/?]/, 1)[0] ?? ''
  let collection: string
  try { collection = decodeURIComponent(segment) }
  catch { collection = segment }
  if (!STAFF_COLLECTIONS.includes(collection)) return
  setResponseHeader(event, 'cache-control', 'private, no-store')
  const user = await getCurrentUser(event)
  if (!user || !DESK.includes(user.role)) {
    throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'Page not found.' })
  }
})
