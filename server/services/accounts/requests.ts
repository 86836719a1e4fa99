// Account requests that must not tell whether an address has an account: a password
// reset request and a registration answer the same at once, and the work that depends
// on the address (a token, an account, a mail) happens after the answer (afterAnswer,
// server/services/accounts/after-answer.ts).
import type { Db } from '../../utils/db'
import { createUser, findUserByEmail, issueUserToken } from './users'

export async function mailPasswordReset(db: Db, email: string): Promise<void> {
  const user = await findUserByEmail(db, email)
  if (!user || user.disabled) return
  await db.transaction(async (trx) => {
    const token = await issueUserToken(trx, user.id, 'reset')
    await enqueueMail(trx, {
      to: user.email,
      subject: 'Reset your Pullsheet password',
      paragraphs: [`Hello ${user.display_name},`, 'Someone asked to reset the password of this account. The link works once, for one hour. If it was not you, ignore this message.'],
      link: { href: `${appConfig().baseUrl}/reset-password?token=${token}`, label: 'Set a new password' },
    })
  })
}

/**
 * A new address gets a reader account without a password and a link to choose one
 * (the invitation's link); an address that has an account gets a mail saying so, and
 * nothing changes on the account.
 */
export async function registerOrTellOwner(db: Db, input: { email: string, displayName: string }): Promise<void> {
  const existing = await findUserByEmail(db, input.email)
  if (existing) {
    await enqueueMail(db, {
      to: existing.email,
      subject: 'You already have a Pullsheet account',
      paragraphs: [`Hello ${existing.display_name},`, 'Someone, perhaps you, asked to create a Pullsheet account with this e-mail address. It has one already, so nothing was changed. Sign in with it; if you forgot the password, ask for a new one on the sign-in page. If it was not you, ignore this message.'],
      link: { href: `${appConfig().baseUrl}/login`, label: 'Sign in' },
    })
    return
  }
  try {
    await db.transaction(async (trx) => {
      const created = await createUser(trx, { ...input, role: 'reader' })
      const token = await issueUserToken(trx, created.id, 'invite')
      await enqueueMail(trx, {
        to: created.email,
        subject: 'Finish creating your Pullsheet account',
        paragraphs: [`Hello ${created.displayName},`, 'Choose a password to finish creating your reader account. The link works once, for three days. If you did not ask for an account, ignore this message and none will be usable.'],
        link: { href: `${appConfig().baseUrl}/reset-password?token=${token}`, label: 'Choose your password' },
      })
    })
  }
  catch (error) {
    // Two sign-ups with one address at once: the other one made the account and its mail.
    if ((error as { statusCode?: number }).statusCode !== 409) throw error
  }
}
