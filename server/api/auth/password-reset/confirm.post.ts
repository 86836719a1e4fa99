import { ResetConfirmBody } from '#shared/types/users'
import { assertAttemptAllowed, clientIp, recordAttempt } from '~~/server/services/accounts/login-limit'
import { redeemUserToken } from '~~/server/services/accounts/users'

// Reset and invitation links. A link that does not work costs a lookup (no password
// hashing) and counts against the IP; the body itself is small (16 KB at most).
export default defineEventHandler(async (event) => {
  const { token, password } = await readValidatedBody(event, zodParser(ResetConfirmBody))
  const ip = clientIp(event)
  await assertAttemptAllowed(useDb(), event, 'reset-confirm', null, ip)
  if (!await redeemUserToken(useDb(), token, password)) {
    await recordAttempt(useDb(), 'reset-confirm', null, ip)
    throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'This link is not valid any more. Ask for a new one.' })
  }
  return { ok: true }
})
