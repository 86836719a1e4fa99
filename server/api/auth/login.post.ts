import { LoginBody } from '#shared/types/users'
import { assertLoginAllowed, clearLoginFailures, clientIp, recordLoginFailure } from '~~/server/services/accounts/login-limit'
import { findUserByEmail } from '~~/server/services/accounts/users'

const VAGUE = 'That e-mail and password do not match an active account.'

export default defineEventHandler(async (event) => {
  const { email, password } = await readValidatedBody(event, zodParser(LoginBody))
  const ip = clientIp(event)
  await assertLoginAllowed(useDb(), event, email, ip)
  const row = await findUserByEmail(useDb(), email)
  // Verify even for unknown e-mails so timing does not tell which accounts exist.
  const ok = row?.password_hash ? await verifyPassword(row.password_hash, password) : (await hashPassword(password), false)
  if (!row || !ok || row.disabled) {
    await recordLoginFailure(useDb(), email, ip)
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: VAGUE })
  }
  await clearLoginFailures(useDb(), email)
  // A fresh session at sign-in (no fixation of an older cookie).
  await replaceUserSession(event, { user: { id: row.id, sv: row.session_version }, loggedInAt: new Date().toISOString() })
  return { user: toCurrentUser(row) }
})
