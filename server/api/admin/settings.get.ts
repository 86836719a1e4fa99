import { getSiteSettingsView } from '~~/server/services/magazine/settings'
// The magazine's settings as the admin page shows them.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'admin')
  return getSiteSettingsView(useDb())
})
