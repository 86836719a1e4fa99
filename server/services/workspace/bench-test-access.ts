import type { Db } from '../../utils/db'
import type { CurrentUser } from '#shared/types/users'
import type { BenchTestRecord } from './bench-test-core'

/** Editors and admins reach every bench test; writers only their own. */
export function seesAllBenchTests(user: CurrentUser): boolean {
  return user.role === 'editor' || user.role === 'admin'
}

/**
 * The bench tests this user may reach, as a query: ownership lives in the SQL
 * WHERE, so a writer asking for another writer's id finds nothing (404).
 */
export function visibleBenchTests(db: Db, user: CurrentUser, opts: { includeDeleted?: boolean } = {}) {
  const query = db<BenchTestRecord>('bench_tests')
  if (!opts.includeDeleted) query.whereNull('bench_tests.deleted_at')
  if (!seesAllBenchTests(user)) query.where('bench_tests.owner_id', user.id)
  return query
}

/** The bench test, or 404 when it does not exist or is not this user's to reach. */
export async function requireBenchTest(db: Db, user: CurrentUser, id: number): Promise<BenchTestRecord> {
  const row = await visibleBenchTests(db, user).where('bench_tests.id', id).first()
  if (!row) notFound('No such bench test.')
  return row
}
