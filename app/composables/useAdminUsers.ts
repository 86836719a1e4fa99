import type { UserRow } from '#shared/types/users'

export const adminUsersKey = () => 'admin-users'

export function useAdminUsers() {
  return useFetch<{ users: UserRow[] }>('/api/users', { key: adminUsersKey() })
}
