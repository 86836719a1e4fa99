import type { Role } from '../types/roles'

/** Demo accounts of the fictional magazine; created only by the demo seed. */
export const DEMO_PASSWORD = 'pullsheet-demo'

export const DEMO_ACCOUNTS: readonly { email: string, displayName: string, role: Role }[] = [
  { email: 'reader@example.com', displayName: 'Rory Reader', role: 'reader' },
  { email: 'writer@example.com', displayName: 'Wren Calloway', role: 'writer' },
  { email: 'editor@example.com', displayName: 'Edda Marsh', role: 'editor' },
  { email: 'admin@example.com', displayName: 'Ada Quill', role: 'admin' },
]
