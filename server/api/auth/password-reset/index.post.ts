import { ResetRequestBody } from '#shared/types/users'

/** Always answers the same, so it does not reveal which e-mails have accounts. */
export default defineEventHandler(async (event) => {
  const { email } = await readValidatedBody(event, zodParser(ResetRequestBody))
  const user = await findUserByEmail(email)
  if (user && !user.disabled) {
    await useDb().transaction(async (trx) => {
      const token = await issueUserToken(user.id, 'reset', trx)
      await enqueueMail(trx, {
        to: user.email,
        subject: 'Reset your Pullsheet password',
        paragraphs: [`Hello ${user.display_name},`, 'Someone asked to reset the password of this account. The link works once, for one hour. If it was not you, ignore this message.'],
        link: { href: `${appConfig().baseUrl}/reset-password?token=${token}`, label: 'Set a new password' },
      })
    })
  }
  return { ok: true }
})
