import { ROLES, type Role } from '../types/roles'

/** Each role may do everything the roles before it may (brief: Roles). */
export function rolesAtLeast(role: Role): Role[] {
  return ROLES.slice(ROLES.indexOf(role))
}

export function hasRole(actual: Role, ...allowed: Role[]): boolean {
  return allowed.includes(actual)
}
