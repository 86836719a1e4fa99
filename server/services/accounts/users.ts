import { createHash, randomBytes } from 'node:crypto'
import type { Db } from '../../utils/db'
import type { Role } from '#shared/types/roles'
import type { CurrentUser, UserRow } from '#shared/types/users'

interface UserDbRow {
  id: number
  email: string
  display_name: string
  role: Role
  password_hash: string | null
  disabled: number | boolean
  session_version: number
  created_at: Date | string
}

function toUserRow(row: UserDbRow): UserRow {
  return {
    id: row.id,
    email: row.email,
    displayName: row.display_name,
    role: row.role,
    disabled: Boolean(row.disabled),
    invited: !row.password_hash,
    createdAt: new Date(row.created_at).toISOString(),
  }
}

export async function findUserByEmail(db: Db, email: string): Promise<UserDbRow | undefined> {
  return db<UserDbRow>('users').where({ email }).first()
}

export async function listUsers(db: Db): Promise<UserRow[]> {
  const rows = await db<UserDbRow>('users').orderBy('id')
  return rows.map(toUserRow)
}

export async function getUserRow(db: Db, id: number): Promise<UserRow | undefined> {
  const row = await db<UserDbRow>('users').where({ id }).first()
  return row ? toUserRow(row) : undefined
}

/** Creates a user; 409 when the e-mail is already registered (case-insensitively). */
export async function createUser(db: Db, input: { email: string, displayName: string, role: Role, password?: string }): Promise<UserRow> {
  try {
    const passwordHash = input.password ? await hashPassword(input.password) : null
    return await db.transaction(async (trx) => {
      const [id] = await trx('users').insert({ email: input.email.toLowerCase(), display_name: input.displayName, role: input.role, password_hash: passwordHash })
      return toUserRow((await trx<UserDbRow>('users').where({ id }).first())!)
    })
  }
  catch (error) {
    if (isDuplicateEntry(error)) throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'An account with this e-mail already exists.', data: { issues: [{ path: 'email', message: 'Already registered' }] } })
    throw error
  }
}

/** Role, name or disabled flag; disabling bumps the session version so it applies at once. */
export async function updateUser(db: Db, actor: CurrentUser, id: number, changes: { role?: Role, disabled?: boolean, displayName?: string }): Promise<UserRow> {
  if (actor.id === id && (changes.disabled === true || (changes.role && changes.role !== 'admin'))) {
    throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'You cannot disable yourself or remove your own admin role.' })
  }
  const patch: Record<string, unknown> = {}
  if (changes.role) patch.role = changes.role
  if (changes.displayName) patch.display_name = changes.displayName
  if (changes.disabled !== undefined) patch.disabled = changes.disabled
  const count = await db('users').where({ id }).update({
    ...patch,
    ...(changes.disabled ? { session_version: db.raw('session_version + 1') } : {}),
  })
  if (!count) notFound('No such user.')
  return (await getUserRow(db, id))!
}

export async function bumpSessionVersion(db: Db, id: number): Promise<number> {
  await db('users').where({ id }).update({ session_version: db.raw('session_version + 1') })
  const row = await db('users').where({ id }).first('session_version')
  return Number(row.session_version)
}

export async function verifyUserPassword(db: Db, id: number, password: string): Promise<boolean> {
  const row = await db<UserDbRow>('users').where({ id }).first('password_hash')
  return Boolean(row?.password_hash) && await verifyPassword(row!.password_hash!, password)
}

/**
 * New password; every other session of this user ends (session version bumped) and
 * every reset or invitation link still open for the account stops working.
 */
export async function setPassword(db: Db, id: number, password: string): Promise<number> {
  const passwordHash = await hashPassword(password)
  // One transaction: a new password never stands while the old sessions still do.
  return db.transaction(async (trx) => {
    await trx('users').where({ id }).update({ password_hash: passwordHash })
    await cancelOpenTokens(trx, id)
    return bumpSessionVersion(trx, id)
  })
}

function cancelOpenTokens(db: Db, userId: number) {
  return db('user_tokens').where({ user_id: userId }).whereNull('used_at').update({ used_at: db.raw('NOW(3)') })
}

const TOKEN_HOURS = { invite: 72, reset: 1 } as const
type TokenPurpose = keyof typeof TOKEN_HOURS

const hashToken = (token: string) => createHash('sha256').update(token).digest('hex')

/** A one-time token for an e-mailed link; only its hash is stored. */
export async function issueUserToken(db: Db, userId: number, purpose: TokenPurpose): Promise<string> {
  const token = randomBytes(32).toString('base64url')
  await db('user_tokens').insert({
    user_id: userId,
    purpose,
    token_hash: hashToken(token),
    expires_at: db.raw('NOW(3) + INTERVAL ? HOUR', [TOKEN_HOURS[purpose]]),
  })
  return token
}

/** An open (unused, unexpired) token: one sha256 and one indexed read, nothing hashed slowly. */
async function findOpenToken(db: Db, token: string, opts: { lock?: boolean } = {}): Promise<{ id: number, user_id: number } | undefined> {
  const query = db('user_tokens')
    .where({ token_hash: hashToken(token) })
    .whereNull('used_at')
    .where('expires_at', '>', db.raw('NOW(3)'))
  if (opts.lock) query.forUpdate()
  return await query.first('id', 'user_id') as { id: number, user_id: number } | undefined
}

/**
 * Uses a token once and sets the password. The token is looked up before the
 * password is hashed, so a link that does not work costs no hashing; using it cancels
 * every other open link of the account. False when the token does not work.
 */
export async function redeemUserToken(db: Db, token: string, password: string): Promise<boolean> {
  if (!await findOpenToken(db, token)) return false
  const passwordHash = await hashPassword(password)
  return db.transaction(async (trx) => {
    const row = await findOpenToken(trx, token, { lock: true })
    if (!row) return false
    await trx('user_tokens').where({ id: row.id }).update({ used_at: trx.raw('NOW(3)') })
    await cancelOpenTokens(trx, row.user_id)
    await trx('users').where({ id: row.user_id }).update({ password_hash: passwordHash, session_version: trx.raw('session_version + 1') })
    return true
  })
}
