import { PasswordChangeBody } from '#shared/types/users'
import { rolesAtLeast } from '#shared/types/roles'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...rolesAtLeast('reader'))
  const body = await readValidatedBody(event, zodParser(PasswordChangeBody))
  if (!(await verifyUserPassword(user.id, body.currentPassword))) {
    throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'The current password is not right.', data: { issues: [{ path: 'currentPassword', message: 'Not right' }] } })
  }
  const sv = await setPassword(user.id, body.newPassword)
  // Other devices are signed out; this one keeps going with the new version.
  await replaceUserSession(event, { user: { id: user.id, sv }, loggedInAt: new Date().toISOString() })
  return { ok: true }
})
