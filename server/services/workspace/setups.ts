// Setups of a bench test: ordered, exactly one live baseline (also guarded by a unique
// index, see the setups migration), soft-deleted. Changes to order and baseline lock
// the bench test row so two requests cannot interleave them.
import type { Knex } from 'knex'
import type { Db } from '../../utils/db'
import type { CreateSetupInput, IdleCheck, IdleCheckInput, PartSpec, Setup, UpdateSetupInput } from '../../../shared/types/setups'
import { confirmDeletion, invalidField, missing, staleVersion } from '../../utils/http-errors'
import { isoTime, isoTimeRequired, parseJsonColumn, asBool } from '../../utils/rows'

interface SetupRow {
  id: number
  bench_test_id: number
  position: number
  is_baseline: number | boolean
  label: string
  description: string
  parts: string
  version: number
  updated_at: Date | string
  deleted_at: Date | string | null
  pull_count: number
  included_count: number
}
interface IdleRow { id: number, setup_id: number, idle_rpm: number, vacuum_inhg: number, note: string, created_at: Date | string }

function toIdleCheck(row: IdleRow): IdleCheck {
  return { id: row.id, setupId: row.setup_id, idleRpm: Number(row.idle_rpm), vacuumInHg: Number(row.vacuum_inhg), note: row.note, createdAt: isoTimeRequired(row.created_at) }
}

function toSetup(row: SetupRow, idleChecks: IdleCheck[]): Setup {
  const parts = parseJsonColumn<unknown>(row.parts, [])
  return {
    id: row.id,
    benchTestId: row.bench_test_id,
    position: row.position,
    isBaseline: asBool(row.is_baseline),
    label: row.label,
    description: row.description,
    parts: Array.isArray(parts) ? parts as PartSpec[] : [],
    idleChecks,
    idleVacuumInHg: idleChecks.length ? idleChecks.reduce((s, c) => s + c.vacuumInHg, 0) / idleChecks.length : null,
    pullCount: Number(row.pull_count),
    includedPullCount: Number(row.included_count),
    version: row.version,
    updatedAt: isoTimeRequired(row.updated_at),
    deletedAt: isoTime(row.deleted_at),
  }
}

function setupQuery(db: Db, benchTestId: number) {
  return db('setups').where('setups.bench_test_id', benchTestId).select(
    'setups.*',
    db.raw('(SELECT COUNT(*) FROM pulls p WHERE p.setup_id = setups.id) AS pull_count'),
    db.raw('(SELECT COUNT(*) FROM pulls p WHERE p.setup_id = setups.id AND p.included = 1) AS included_count'),
  )
}

async function withIdleChecks(db: Db, rows: SetupRow[]): Promise<Setup[]> {
  const ids = rows.map(r => r.id)
  const checks = ids.length ? await db<IdleRow>('idle_checks').whereIn('setup_id', ids).orderBy('id') : []
  return rows.map(r => toSetup(r, checks.filter(c => c.setup_id === r.id).map(toIdleCheck)))
}

export async function listSetups(db: Db, benchTestId: number, opts: { deleted?: boolean } = {}): Promise<Setup[]> {
  const query = setupQuery(db, benchTestId)
  if (opts.deleted) query.whereNotNull('setups.deleted_at').orderBy('setups.deleted_at', 'desc')
  else query.whereNull('setups.deleted_at').orderBy('setups.position').orderBy('setups.id')
  return withIdleChecks(db, await query as SetupRow[])
}

export async function getSetup(db: Db, benchTestId: number, setupId: number, opts: { deleted?: boolean } = {}): Promise<Setup> {
  const query = setupQuery(db, benchTestId).where('setups.id', setupId)
  if (opts.deleted) query.whereNotNull('setups.deleted_at')
  else query.whereNull('setups.deleted_at')
  const row = await query.first() as SetupRow | undefined
  if (!row) missing(opts.deleted ? 'No such deleted setup in this bench test.' : 'No such setup in this bench test.')
  return (await withIdleChecks(db, [row]))[0]!
}

async function lockBenchTest(trx: Knex.Transaction, benchTestId: number): Promise<void> {
  await trx('bench_tests').where({ id: benchTestId }).forUpdate().first('id')
}

async function nextPosition(trx: Knex.Transaction, benchTestId: number): Promise<number> {
  const row = await trx('setups').where({ bench_test_id: benchTestId }).whereNull('deleted_at').max({ p: 'position' }).first() as { p: number | null } | undefined
  return Number(row?.p ?? 0) + 1
}

async function hasLiveBaseline(trx: Knex.Transaction, benchTestId: number): Promise<boolean> {
  return Boolean(await trx('setups').where({ bench_test_id: benchTestId, is_baseline: true }).whereNull('deleted_at').first('id'))
}

export async function createSetup(db: Db, benchTestId: number, input: CreateSetupInput): Promise<Setup> {
  return db.transaction(async (trx) => {
    await lockBenchTest(trx, benchTestId)
    const baseline = input.baseline === true || !(await hasLiveBaseline(trx, benchTestId))
    if (baseline) await trx('setups').where({ bench_test_id: benchTestId }).update({ is_baseline: false })
    const [newId] = await trx('setups').insert({
      bench_test_id: benchTestId,
      position: await nextPosition(trx, benchTestId),
      is_baseline: baseline,
      label: input.label,
      description: input.description ?? '',
      parts: JSON.stringify(input.parts ?? []),
    })
    return getSetup(trx, benchTestId, Number(newId))
  })
}

export async function updateSetup(db: Db, benchTestId: number, setupId: number, input: UpdateSetupInput): Promise<Setup> {
  await getSetup(db, benchTestId, setupId)
  const patch: Record<string, unknown> = {}
  if (input.label !== undefined) patch.label = input.label
  if (input.description !== undefined) patch.description = input.description
  if (input.parts !== undefined) patch.parts = JSON.stringify(input.parts)
  return db.transaction(async (trx) => {
    const count = await trx('setups').where({ id: setupId, bench_test_id: benchTestId, version: input.version }).whereNull('deleted_at')
      .update({ ...patch, version: trx.raw('version + 1') })
    if (!count) staleVersion(await getSetup(trx, benchTestId, setupId), 'setup')
    return getSetup(trx, benchTestId, setupId)
  })
}

/** Soft delete; a deleted baseline hands the role to the first setup left. */
export async function deleteSetup(db: Db, benchTestId: number, setupId: number, confirm: boolean): Promise<Setup> {
  const setup = await getSetup(db, benchTestId, setupId)
  if (setup.pullCount > 0 && !confirm) confirmDeletion('setup', 0, setup.pullCount)
  return db.transaction(async (trx) => {
    await lockBenchTest(trx, benchTestId)
    await trx('setups').where({ id: setupId }).update({ deleted_at: trx.raw('CURRENT_TIMESTAMP(3)'), is_baseline: false, version: trx.raw('version + 1') })
    if (setup.isBaseline) {
      const next = await trx('setups').where({ bench_test_id: benchTestId }).whereNull('deleted_at').orderBy('position').orderBy('id').first('id')
      if (next) await trx('setups').where({ id: next.id }).update({ is_baseline: true })
    }
    return getSetup(trx, benchTestId, setupId, { deleted: true })
  })
}

/** Back at the end of the order; the baseline again only when there is none. */
export async function restoreSetup(db: Db, benchTestId: number, setupId: number): Promise<Setup> {
  await getSetup(db, benchTestId, setupId, { deleted: true })
  return db.transaction(async (trx) => {
    await lockBenchTest(trx, benchTestId)
    const baseline = !(await hasLiveBaseline(trx, benchTestId))
    await trx('setups').where({ id: setupId }).update({ deleted_at: null, is_baseline: baseline, position: await nextPosition(trx, benchTestId), version: trx.raw('version + 1') })
    return getSetup(trx, benchTestId, setupId)
  })
}

export async function makeBaseline(db: Db, benchTestId: number, setupId: number): Promise<Setup[]> {
  await getSetup(db, benchTestId, setupId)
  return db.transaction(async (trx) => {
    await lockBenchTest(trx, benchTestId)
    // Clear first: the unique baseline marker would refuse two at once.
    await trx('setups').where({ bench_test_id: benchTestId }).whereNot({ id: setupId }).update({ is_baseline: false })
    await trx('setups').where({ id: setupId }).update({ is_baseline: true })
    return listSetups(trx, benchTestId)
  })
}

export async function reorderSetups(db: Db, benchTestId: number, setupIds: number[]): Promise<Setup[]> {
  return db.transaction(async (trx) => {
    await lockBenchTest(trx, benchTestId)
    const live = (await trx('setups').where({ bench_test_id: benchTestId }).whereNull('deleted_at').pluck('id') as number[]).map(Number)
    const same = live.length === setupIds.length && new Set(setupIds).size === setupIds.length && setupIds.every(id => live.includes(id))
    if (!same) invalidField('setupIds', `List every setup of this bench test exactly once (${live.length} setups: ${live.join(', ')}).`)
    for (const [index, id] of setupIds.entries()) await trx('setups').where({ id }).update({ position: index + 1 })
    return listSetups(trx, benchTestId)
  })
}

export async function addIdleCheck(db: Db, benchTestId: number, setupId: number, input: IdleCheckInput, userId: number | null): Promise<IdleCheck> {
  await getSetup(db, benchTestId, setupId)
  return db.transaction(async (trx) => {
    const [id] = await trx('idle_checks').insert({ setup_id: setupId, idle_rpm: input.idleRpm, vacuum_inhg: input.vacuumInHg, note: input.note ?? '', created_by: userId })
    return toIdleCheck((await trx<IdleRow>('idle_checks').where({ id }).first())!)
  })
}

export async function deleteIdleCheck(db: Db, benchTestId: number, setupId: number, checkId: number): Promise<void> {
  await getSetup(db, benchTestId, setupId)
  const count = await db('idle_checks').where({ id: checkId, setup_id: setupId }).delete()
  if (!count) missing('No such idle check on this setup.')
}
