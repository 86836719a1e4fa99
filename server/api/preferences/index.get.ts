import { rolesAtLeast } from '#shared/types/roles'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...rolesAtLeast('reader'))
  return { preferences: await readerPreferences(user.id) }
})
