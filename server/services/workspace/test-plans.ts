// Test plans: the plan of a bench test (version-checked, copied from another bench
// test) and the moves of the day (start a step, skip it, tick its checklist). Kept apart
// from the day view (dyno-day.ts), whose analysis imports go through Nuxt's aliases, so
// the database seed can write a plan through the same code under plain tsx.
import { randomBytes } from 'node:crypto'
import type { Knex } from 'knex'
import type { Db } from '../../utils/db'
import { DEFAULT_ACCEPTANCE, type Acceptance, type ChecklistItem, type DayAction, type PlanStep, type PlanStepInput, type SavePlanInput, type TestPlan } from '../../../shared/types/dyno-day'
import type { PartSpec } from '../../../shared/types/setups'
import { bumpLiveMark } from './live-marks'
import { createSetup } from './setups'
import { invalidField, missing, staleVersion } from '../../utils/http-errors'
import { isoTime, parseJsonColumn } from '../../utils/rows'

interface PlanRow {
  bench_test_id: number
  acceptance: string
  notes: string
  current_step_id: number | null
  day_started_at: Date | string | null
  version: number
  updated_at: Date | string
  updater_name: string | null
}

interface StepRow {
  id: number
  position: number
  setup_id: number
  setup_label: string
  setup_deleted_at: Date | string | null
  parts_change: string
  swap_minutes: number | null
  planned_pulls: number
  checklist: string
  started_at: Date | string | null
  skipped_at: Date | string | null
}

const newItemId = () => randomBytes(6).toString('hex')

function toStep(row: StepRow): PlanStep {
  const list = parseJsonColumn<unknown>(row.checklist, [])
  return {
    id: row.id,
    position: row.position,
    setupId: row.setup_id,
    setupLabel: row.setup_deleted_at ? `${row.setup_label} (deleted setup)` : row.setup_label,
    partsChange: row.parts_change,
    swapMinutes: row.swap_minutes === null ? null : Number(row.swap_minutes),
    plannedPulls: Number(row.planned_pulls),
    checklist: Array.isArray(list) ? list as ChecklistItem[] : [],
    startedAt: isoTime(row.started_at),
    skippedAt: isoTime(row.skipped_at),
  }
}

async function stepRows(db: Db, benchTestId: number): Promise<StepRow[]> {
  return await db('test_plan_steps').join('setups', 'setups.id', 'test_plan_steps.setup_id')
    .where('test_plan_steps.bench_test_id', benchTestId)
    .orderBy('test_plan_steps.position').orderBy('test_plan_steps.id')
    .select('test_plan_steps.*', 'setups.label as setup_label', 'setups.deleted_at as setup_deleted_at') as StepRow[]
}

export async function getTestPlan(db: Db, benchTestId: number): Promise<TestPlan> {
  const row = await db('test_plans').leftJoin('users', 'users.id', 'test_plans.updated_by')
    .where('test_plans.bench_test_id', benchTestId).first('test_plans.*', 'users.display_name as updater_name') as PlanRow | undefined
  if (!row) {
    return { benchTestId, version: 0, acceptance: DEFAULT_ACCEPTANCE, notes: '', steps: [], currentStepId: null, dayStartedAt: null, updatedAt: null, updatedByName: null }
  }
  return {
    benchTestId,
    version: row.version,
    acceptance: { ...DEFAULT_ACCEPTANCE, ...parseJsonColumn<Partial<Acceptance>>(row.acceptance, {}) },
    notes: row.notes,
    steps: (await stepRows(db, benchTestId)).map(toStep),
    currentStepId: row.current_step_id,
    dayStartedAt: isoTime(row.day_started_at),
    updatedAt: isoTime(row.updated_at),
    updatedByName: row.updater_name,
  }
}

type StepToSave = PlanStepInput & { newSetupParts?: PartSpec[] }

/** The whole plan replaces the stored one when `version` is the one stored; steps kept by id keep their day state and ticks. */
export async function saveTestPlan(db: Db, userId: number, benchTestId: number, input: Omit<SavePlanInput, 'steps'> & { steps: StepToSave[] }): Promise<TestPlan> {
  return db.transaction(async (trx) => {
    await trx('bench_tests').where({ id: benchTestId }).forUpdate().first('id')
    const row = await trx('test_plans').where({ bench_test_id: benchTestId }).forUpdate().first('version', 'current_step_id') as { version: number, current_step_id: number | null } | undefined
    if ((row?.version ?? 0) !== input.version) {
      // Read outside this transaction's locks is fine: the answer is only for the conflict dialog.
      staleVersion(await getTestPlan(trx, benchTestId), 'test plan')
    }
    const oldSteps = new Map((await trx('test_plan_steps').where({ bench_test_id: benchTestId }).select('id', 'checklist') as { id: number, checklist: string }[]).map(s => [s.id, s]))
    const liveSetups = new Set(await trx('setups').where({ bench_test_id: benchTestId }).whereNull('deleted_at').pluck('id') as number[])
    for (const [i, step] of input.steps.entries()) {
      if (step.id !== undefined && !oldSteps.has(step.id)) invalidField(`steps.${i}.id`, `Step ${step.id} is not a step of this plan; reload the plan.`)
      if (step.setupId !== null && !liveSetups.has(step.setupId)) invalidField(`steps.${i}.setupId`, `Setup ${step.setupId} is not a live setup of this bench test.`)
    }
    if (row) await trx('test_plans').where({ bench_test_id: benchTestId }).update({ acceptance: JSON.stringify(input.acceptance), notes: input.notes, version: trx.raw('version + 1'), updated_by: userId, updated_at: trx.raw('CURRENT_TIMESTAMP(3)') })
    else await trx('test_plans').insert({ bench_test_id: benchTestId, acceptance: JSON.stringify(input.acceptance), notes: input.notes, version: 1, updated_by: userId })
    const kept = new Set<number>()
    for (const [i, step] of input.steps.entries()) {
      const setupId = step.setupId ?? (await createSetup(trx as unknown as Knex, benchTestId, { label: step.newSetupLabel!, parts: step.newSetupParts })).id
      const before = step.id !== undefined ? parseJsonColumn<ChecklistItem[]>(oldSteps.get(step.id)!.checklist, []) : []
      const checklist: ChecklistItem[] = step.checklist.map((item) => {
        const old = item.id ? before.find(b => b.id === item.id) : undefined
        return { id: old?.id ?? newItemId(), text: item.text, done: old?.done ?? false, doneAt: old?.doneAt ?? null }
      })
      const values = { position: i + 1, setup_id: setupId, parts_change: step.partsChange, swap_minutes: step.swapMinutes, planned_pulls: step.plannedPulls, checklist: JSON.stringify(checklist) }
      if (step.id !== undefined) {
        await trx('test_plan_steps').where({ id: step.id }).update(values)
        kept.add(step.id)
      }
      else {
        const [id] = await trx('test_plan_steps').insert({ bench_test_id: benchTestId, ...values })
        kept.add(Number(id))
      }
    }
    const gone = [...oldSteps.keys()].filter(id => !kept.has(id))
    if (gone.length) {
      if (row?.current_step_id && gone.includes(row.current_step_id)) await trx('test_plans').where({ bench_test_id: benchTestId }).update({ current_step_id: null })
      await trx('test_plan_steps').whereIn('id', gone).delete()
    }
    await bumpLiveMark(trx, benchTestId)
    return getTestPlan(trx, benchTestId)
  })
}

/**
 * Another bench test's plan replaces this one's; its setups come over as planned setups
 * with their parts. The caller has checked that this user may read the other bench test.
 */
export async function copyTestPlan(db: Db, userId: number, benchTestId: number, fromBenchTestId: number, version: number): Promise<TestPlan> {
  if (fromBenchTestId === benchTestId) invalidField('fromBenchTestId', 'Pick another bench test to copy its plan from.')
  const plan = await getTestPlan(db, fromBenchTestId)
  if (plan.version === 0 || plan.steps.length === 0) invalidField('fromBenchTestId', 'That bench test has no plan to copy.')
  const sourceSetups = new Map((await db('setups').whereIn('id', plan.steps.map(s => s.setupId)).select('id', 'label', 'parts') as { id: number, label: string, parts: string }[]).map(s => [s.id, s]))
  const ownByLabel = new Map((await db('setups').where({ bench_test_id: benchTestId }).whereNull('deleted_at').select('id', 'label') as { id: number, label: string }[]).map(s => [s.label.toLowerCase(), s.id]))
  const steps: StepToSave[] = plan.steps.map((s) => {
    const src = sourceSetups.get(s.setupId)
    const label = src?.label ?? s.setupLabel
    const own = ownByLabel.get(label.toLowerCase())
    return {
      setupId: own ?? null,
      ...(own ? {} : { newSetupLabel: label, newSetupParts: parseJsonColumn<PartSpec[]>(src?.parts, []) }),
      partsChange: s.partsChange,
      swapMinutes: s.swapMinutes,
      plannedPulls: s.plannedPulls,
      checklist: s.checklist.map(c => ({ text: c.text })),
    }
  })
  return saveTestPlan(db, userId, benchTestId, { version, acceptance: plan.acceptance, notes: plan.notes, steps })
}

/** One move of the day; each changes one row, so two people working the day do not need versions. */
export async function applyDayAction(db: Db, benchTestId: number, action: DayAction): Promise<TestPlan> {
  return db.transaction(async (trx) => {
    const step = await trx('test_plan_steps').where({ id: action.stepId, bench_test_id: benchTestId }).forUpdate().first('id', 'position', 'checklist', 'started_at') as { id: number, position: number, checklist: string, started_at: Date | null } | undefined
    if (!step) missing('No such step in this bench test\'s plan.')
    if (action.action === 'start') {
      await trx('test_plan_steps').where({ id: step.id }).update({ skipped_at: null, ...(step.started_at ? {} : { started_at: trx.raw('CURRENT_TIMESTAMP(3)') }) })
      await trx('test_plans').where({ bench_test_id: benchTestId }).update({ current_step_id: step.id, day_started_at: trx.raw('COALESCE(day_started_at, CURRENT_TIMESTAMP(3))') })
    }
    else if (action.action === 'skip') {
      await trx('test_plan_steps').where({ id: step.id }).update({ skipped_at: trx.raw('CURRENT_TIMESTAMP(3)') })
      const plan = await trx('test_plans').where({ bench_test_id: benchTestId }).first('current_step_id') as { current_step_id: number | null }
      if (plan.current_step_id === step.id) await trx('test_plans').where({ bench_test_id: benchTestId }).update({ current_step_id: null })
    }
    else {
      const list = parseJsonColumn<ChecklistItem[]>(step.checklist, [])
      const item = list.find(i => i.id === action.itemId)
      if (!item) missing('No such item on this step\'s checklist; reload the plan.')
      item.done = action.done
      item.doneAt = action.done ? new Date().toISOString() : null
      await trx('test_plan_steps').where({ id: step.id }).update({ checklist: JSON.stringify(list) })
    }
    await bumpLiveMark(trx, benchTestId)
    return getTestPlan(trx, benchTestId)
  })
}
