import { bumpSessionVersion } from '~~/server/services/accounts/users'
/** Ends the session everywhere at once: the sealed cookie dies with its session version. */
export default defineEventHandler(async (event) => {
  const user = await getCurrentUser(event)
  if (user) await bumpSessionVersion(useDb(), user.id)
  await clearUserSession(event)
  return { ok: true }
})
