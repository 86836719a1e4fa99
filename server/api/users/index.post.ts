import { CreateUserBody } from '#shared/types/users'
import { createUser, issueUserToken } from '~~/server/services/accounts/users'

/** With a password the account is ready; without one the person is invited by e-mail. */
export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'admin')
  const body = await readValidatedBody(event, zodParser(CreateUserBody))
  const invited = !body.password
  const user = await useDb().transaction(async (trx) => {
    const created = await createUser(trx, body)
    if (invited) {
      const token = await issueUserToken(trx, created.id, 'invite')
      await enqueueMail(trx, {
        to: created.email,
        subject: 'You are invited to Pullsheet',
        paragraphs: [`Hello ${created.displayName},`, `${admin.displayName} has made you a ${created.role} on Pullsheet. Choose a password to start; the link works once, for three days.`],
        link: { href: `${appConfig().baseUrl}/reset-password?token=${token}`, label: 'Choose your password' },
      })
    }
    return created
  })
  setResponseStatus(event, 201)
  return { user, invited }
})
