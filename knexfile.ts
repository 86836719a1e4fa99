// Used by scripts/db.ts (knex's own CLI cannot load a TypeScript knexfile on Node 20).
import { join } from 'node:path'
import { knexConfig } from './server/db/knex-config'

export default knexConfig(process.env.DATABASE_URL ?? '', join(import.meta.dirname, 'server', 'db', 'migrations'))
