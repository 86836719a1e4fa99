import { rolesAtLeast } from '#shared/accounts/roles'
import { readerPreferences } from '~~/server/services/magazine/preferences'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...rolesAtLeast('reader'))
  return { preferences: await readerPreferences(useDb(), user.id) }
})
