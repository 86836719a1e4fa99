// Bench tests as a user reaches them: only through visibleBenchTests (ownership in the
// WHERE). Creation and the DTO live in bench-test-core.ts.
import type { Db } from '../../utils/db'
import type { CurrentUser } from '../../../shared/types/users'
import type { BenchTest, BenchTestDetail, BenchTestSummary, UpdateBenchTestInput } from '../../../shared/types/bench-tests'
import { visibleBenchTests } from './bench-test-access'
import { benchTestById, toBenchTest, withOwner, type BenchTestRow } from './bench-test-core'
import { confirmDeletion, invalidField, missing, staleVersion } from '../../utils/http-errors'
import { getBuildSheet } from './build-sheets'
import { listSetups } from './setups'

/** One bench test as its owner (or an editor) sees it; 404 otherwise. */
export async function findBenchTest(db: Db, user: CurrentUser, id: number, opts: { deleted?: boolean } = {}): Promise<BenchTest> {
  const query = visibleBenchTests(db, user, { includeDeleted: opts.deleted }).where('bench_tests.id', id)
  if (opts.deleted) query.whereNotNull('bench_tests.deleted_at')
  const row = await withOwner(query).first() as BenchTestRow | undefined
  if (!row) missing(opts.deleted ? 'No such deleted bench test.' : 'No such bench test.')
  return toBenchTest(row)
}

export async function listBenchTests(db: Db, user: CurrentUser, query: { deleted?: 'only', q?: string } = {}): Promise<BenchTestSummary[]> {
  const q = visibleBenchTests(db, user, { includeDeleted: query.deleted === 'only' })
  if (query.deleted === 'only') q.whereNotNull('bench_tests.deleted_at')
  if (query.q) q.where('bench_tests.title', 'like', `%${query.q.replace(/[\\%_]/g, c => `\\${c}`)}%`)
  const rows = await withOwner(q)
    .select(
      db.raw('(SELECT COUNT(*) FROM setups s WHERE s.bench_test_id = bench_tests.id AND s.deleted_at IS NULL) AS setup_count'),
      db.raw('(SELECT COUNT(*) FROM pulls p JOIN setups s ON s.id = p.setup_id WHERE p.bench_test_id = bench_tests.id AND s.deleted_at IS NULL) AS pull_count'),
      db.raw('(SELECT COUNT(*) FROM inbox_files f WHERE f.bench_test_id = bench_tests.id AND f.state = \'waiting\') AS inbox_waiting'),
    )
    .orderBy('bench_tests.updated_at', 'desc')
    .orderBy('bench_tests.id', 'desc')
    .limit(500) as (BenchTestRow & { setup_count: number, pull_count: number, inbox_waiting: number })[]
  return rows.map((row) => {
    const { notes: _notes, ...rest } = toBenchTest(row)
    return { ...rest, setupCount: Number(row.setup_count), pullCount: Number(row.pull_count), inboxWaiting: Number(row.inbox_waiting) }
  })
}

export async function getBenchTestDetail(db: Db, user: CurrentUser, id: number): Promise<BenchTestDetail> {
  const benchTest = await findBenchTest(db, user, id)
  const [buildSheet, setups] = await Promise.all([getBuildSheet(db, id), listSetups(db, id)])
  return { benchTest, buildSheet, setups }
}

export async function updateBenchTest(db: Db, user: CurrentUser, id: number, input: UpdateBenchTestInput): Promise<BenchTest> {
  const current = await findBenchTest(db, user, id)
  const patch: Record<string, unknown> = {}
  if (input.title !== undefined) patch.title = input.title
  if (input.engineFamily !== undefined) patch.engine_family = input.engineFamily
  if (input.partType !== undefined) patch.part_type = input.partType
  if (input.shop !== undefined) patch.shop = input.shop
  if (input.dyno !== undefined) patch.dyno = input.dyno
  if (input.testedFrom !== undefined) patch.tested_from = input.testedFrom
  if (input.testedTo !== undefined) patch.tested_to = input.testedTo
  if (input.notes !== undefined) patch.notes = input.notes
  if (input.defaultStandard !== undefined) patch.default_standard = input.defaultStandard
  const from = input.testedFrom !== undefined ? input.testedFrom : current.testedFrom
  const to = input.testedTo !== undefined ? input.testedTo : current.testedTo
  if (from && to && from > to) {
    invalidField('testedTo', 'The last test day comes after the first')
  }
  const count = await db('bench_tests').where({ id, version: input.version }).whereNull('deleted_at')
    .update({ ...patch, version: db.raw('version + 1') })
  if (!count) staleVersion(await benchTestById(db, id), 'bench test')
  return benchTestById(db, id)
}

async function pullCounts(db: Db, benchTestId: number): Promise<{ setups: number, pulls: number }> {
  const row = await db('pulls').join('setups', 'setups.id', 'pulls.setup_id')
    .where('pulls.bench_test_id', benchTestId).whereNull('setups.deleted_at')
    .first(db.raw('COUNT(*) AS pulls'), db.raw('COUNT(DISTINCT pulls.setup_id) AS setups')) as { pulls: number, setups: number } | undefined
  return { setups: Number(row?.setups ?? 0), pulls: Number(row?.pulls ?? 0) }
}

/** Soft delete; with pulls it needs confirm (409 with what would go otherwise). */
export async function deleteBenchTest(db: Db, user: CurrentUser, id: number, confirm: boolean): Promise<BenchTest> {
  await findBenchTest(db, user, id)
  const counts = await pullCounts(db, id)
  if (counts.pulls > 0 && !confirm) confirmDeletion('bench test', counts.setups, counts.pulls)
  await db('bench_tests').where({ id }).whereNull('deleted_at').update({ deleted_at: db.raw('CURRENT_TIMESTAMP(3)'), version: db.raw('version + 1') })
  return benchTestById(db, id)
}

export async function restoreBenchTest(db: Db, user: CurrentUser, id: number): Promise<BenchTest> {
  await findBenchTest(db, user, id, { deleted: true })
  await db('bench_tests').where({ id }).update({ deleted_at: null, version: db.raw('version + 1') })
  return benchTestById(db, id)
}
