// No zod here: this file is in every page's first-load JS (header, middleware);
// RoleSchema lives in ./users.ts, rolesAtLeast in shared/accounts/roles.ts.
export const ROLES = ['reader', 'writer', 'editor', 'admin'] as const
export type Role = typeof ROLES[number]

export const ROLE_LABELS: Record<Role, string> = {
  reader: 'Reader',
  writer: 'Writer',
  editor: 'Editor',
  admin: 'Admin',
}
