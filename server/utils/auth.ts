import type { H3Event } from 'h3'
import type { Role } from '#shared/types/roles'
import type { CurrentUser } from '#shared/types/users'
import { decideAccess } from '#shared/utils/access'

interface UserRecord { id: number, email: string, display_name: string, role: Role, disabled: number | boolean, session_version: number }

export function toCurrentUser(row: UserRecord): CurrentUser {
  return { id: row.id, email: row.email, displayName: row.display_name, role: row.role }
}

/**
 * The signed-in user, re-read from the database: a disabled account, a changed
 * role or a bumped session version (sign-out, password change) applies at once.
 */
export async function getCurrentUser(event: H3Event): Promise<CurrentUser | null> {
  if (event.context.currentUser !== undefined) return event.context.currentUser
  const session = await withKnownSession(event, () => getUserSession(event))
  let user: CurrentUser | null = null
  if (session?.user?.id) {
    const row = await useDb()<UserRecord>('users')
      .where({ id: session.user.id, session_version: session.user.sv, disabled: false })
      .first('id', 'email', 'display_name', 'role', 'disabled', 'session_version')
    if (row) user = toCurrentUser(row)
    else await clearUserSession(event)
  }
  event.context.currentUser = user
  return user
}

/** The one gate for protected routes: 401 when signed out, 403 when the role is not listed. */
export async function requireRole(event: H3Event, ...roles: Role[]): Promise<CurrentUser> {
  const user = await getCurrentUser(event)
  const decision = decideAccess(user, roles)
  if (!decision.ok) throw createError({ statusCode: decision.status, statusMessage: decision.status === 401 ? 'Unauthorized' : 'Forbidden', message: decision.message })
  return user!
}

declare module 'h3' {
  interface H3EventContext {
    currentUser?: CurrentUser | null
  }
}
