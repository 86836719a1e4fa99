import { ResetRequestBody } from '#shared/types/users'
import { assertAttemptAllowed, clientIp, recordAttempt } from '~~/server/services/accounts/login-limit'
import { afterAnswer } from '~~/server/services/accounts/after-answer'
import { mailPasswordReset } from '~~/server/services/accounts/requests'

/**
 * Always answers the same, at once: whether the address has an account is decided
 * after the answer (server/services/accounts/requests.ts), so neither the words nor the
 * time tell. Limited per address and per IP.
 */
export default defineEventHandler(async (event) => {
  const { email } = await readValidatedBody(event, zodParser(ResetRequestBody))
  const ip = clientIp(event)
  await assertAttemptAllowed(useDb(), event, 'reset-request', email, ip)
  await recordAttempt(useDb(), 'reset-request', email, ip)
  afterAnswer(event, 'password reset mail', () => mailPasswordReset(useDb(), email))
  return { ok: true }
})
