import { RegisterBody } from '#shared/types/users'
import { assertAttemptAllowed, clientIp, recordAttempt } from '~~/server/services/accounts/login-limit'
import { afterAnswer } from '~~/server/services/accounts/after-answer'
import { registerOrTellOwner } from '~~/server/services/accounts/requests'

/**
 * Readers sign themselves up; other roles are given by an admin. The answer is the
 * same whether or not the address has an account (202, "a mail is on its way"): a new
 * address gets a link to choose its password, a known one a mail telling its owner.
 */
export default defineEventHandler(async (event) => {
  const body = await readValidatedBody(event, zodParser(RegisterBody))
  const ip = clientIp(event)
  await assertAttemptAllowed(useDb(), event, 'register', body.email, ip)
  await recordAttempt(useDb(), 'register', body.email, ip)
  afterAnswer(event, 'registration', () => registerOrTellOwner(useDb(), body))
  setResponseStatus(event, 202)
  return { mailed: true }
})
