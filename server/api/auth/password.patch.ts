import { PasswordChangeBody } from '#shared/types/users'
import { rolesAtLeast } from '#shared/accounts/roles'
import { assertLoginAllowed, clientIp, recordLoginFailure } from '~~/server/services/accounts/login-limit'
import { setPassword, verifyUserPassword } from '~~/server/services/accounts/users'

// A wrong current password counts as a failed sign-in of the account (and its limit
// applies here too), so a stolen session cannot be used to guess the password.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...rolesAtLeast('reader'))
  const body = await readValidatedBody(event, zodParser(PasswordChangeBody))
  const ip = clientIp(event)
  await assertLoginAllowed(useDb(), event, user.email, ip)
  if (!(await verifyUserPassword(useDb(), user.id, body.currentPassword))) {
    await recordLoginFailure(useDb(), user.email, ip)
    throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'The current password is not right.', data: { issues: [{ path: 'currentPassword', message: 'Not right' }] } })
  }
  const sv = await setPassword(useDb(), user.id, body.newPassword)
  // Other devices are signed out; this one keeps going with the new version.
  await replaceUserSession(event, { user: { id: user.id, sv }, loggedInAt: new Date().toISOString() })
  return { ok: true }
})
