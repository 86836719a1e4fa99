// No zod here: this file is in every page's first-load JS (header, middleware);
// RoleSchema lives in ./users.ts.
export const ROLES = ['reader', 'writer', 'editor', 'admin'] as const
export type Role = typeof ROLES[number]

/** Each role may do everything the roles before it may (brief: Roles). */
export function rolesAtLeast(role: Role): Role[] {
  return ROLES.slice(ROLES.indexOf(role))
}

export function hasRole(actual: Role, ...allowed: Role[]): boolean {
  return allowed.includes(actual)
}

export const ROLE_LABELS: Record<Role, string> = {
  reader: 'Reader',
  writer: 'Writer',
  editor: 'Editor',
  admin: 'Admin',
}
