import { listUsers } from '~~/server/services/accounts/users'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'admin')
  return { users: await listUsers(useDb()) }
})
