// The dyno day: a test plan per bench test (ordered steps, each a setup with its parts
// change, swap checklist and planned pulls; one acceptance window for every pull) and
// the day view built from it. Routes: docs/api/dyno-day.md.
import { z } from 'zod'
import type { PullSummary } from './pulls'
import { IdSchema, VersionSchema } from './workspace'

export const DAY_LIMITS = { maxSteps: 30, maxChecklistItems: 30, maxPlannedPulls: 20 } as const

const range = (label: string, min: number, max: number) => z.object({
  min: z.number({ error: `Enter the lowest ${label} as a number` }).min(min, `${label} below ${min} is not plausible`).max(max, `${label} above ${max} is not plausible`),
  max: z.number({ error: `Enter the highest ${label} as a number` }).min(min, `${label} below ${min} is not plausible`).max(max, `${label} above ${max} is not plausible`),
}).refine(r => r.min <= r.max, { message: `The lowest ${label} must not be above the highest`, path: ['max'] })

/** What makes a pull count: every limit that is null is not checked. Temperatures in F, pressure in inHg. */
export const AcceptanceSchema = z.object({
  rpmFrom: z.number({ error: 'Enter the rpm the pull starts at' }).int().min(500, 'Start the rpm range at 500 or above').max(15000, 'rpm above 15,000 is not plausible'),
  rpmTo: z.number({ error: 'Enter the rpm the pull ends at' }).int().min(500, 'rpm below 500 is not plausible').max(15000, 'rpm above 15,000 is not plausible'),
  coolantF: range('coolant temperature', 32, 280).nullable(),
  oilF: range('oil temperature', 32, 330).nullable(),
  airTempF: range('air temperature', -40, 140).nullable(),
  baroInHg: range('barometric pressure', 15, 32.5).nullable(),
  /** Largest spread between repeat pulls of one setup that still lets the desk call it, percent. */
  repeatPct: z.number({ error: 'Enter the repeatability needed in percent' }).min(0.1, 'Repeatability under 0.1 percent is not reachable').max(10, 'Repeatability over 10 percent says nothing'),
}).refine(a => a.rpmFrom < a.rpmTo, { message: 'The rpm range must end above where it starts', path: ['rpmTo'] })
export type Acceptance = z.infer<typeof AcceptanceSchema>

/** A sensible window to start from; every figure is the writer's to change ("common practice", not a standard). */
export const DEFAULT_ACCEPTANCE: Acceptance = {
  rpmFrom: 3000, rpmTo: 6500, coolantF: { min: 170, max: 200 }, oilF: { min: 180, max: 240 }, airTempF: null, baroInHg: null, repeatPct: 1,
}

const ChecklistItemBody = z.object({
  /** Kept from the plan read, so an edit keeps its tick; new items leave it out. */
  id: z.string().regex(/^[a-z0-9]{1,16}$/, 'Not a checklist item id').optional(),
  text: z.string().trim().min(1, 'Say what to do').max(200, 'Keep a checklist item under 200 characters'),
})

export const PlanStepBody = z.object({
  /** A step of the plan as read; left out for a new step. */
  id: IdSchema.optional(),
  /** An existing setup of this bench test, or null with newSetupLabel for a planned setup the plan creates. */
  setupId: IdSchema.nullable(),
  newSetupLabel: z.string().trim().max(120, 'Keep the name under 120 characters').optional(),
  partsChange: z.string().trim().max(500, 'Keep the parts change under 500 characters'),
  swapMinutes: z.number().int('Whole minutes').min(0, 'Minutes cannot be negative').max(1440, 'A swap over a day is not a step').nullable(),
  plannedPulls: z.number({ error: 'Enter the number of pulls' }).int('Whole pulls').min(1, 'Plan at least one pull').max(DAY_LIMITS.maxPlannedPulls, `At most ${DAY_LIMITS.maxPlannedPulls} pulls per step`),
  checklist: z.array(ChecklistItemBody).max(DAY_LIMITS.maxChecklistItems, `At most ${DAY_LIMITS.maxChecklistItems} items per step`),
}).refine(s => s.setupId !== null || (s.newSetupLabel ?? '').length > 0, { message: 'Pick a setup or name the new one', path: ['newSetupLabel'] })
export type PlanStepInput = z.infer<typeof PlanStepBody>

/** PUT /api/bench-tests/:id/plan: the whole plan, with the version read (0 when there is none yet). */
export const SavePlanBody = z.object({
  version: VersionSchema,
  acceptance: AcceptanceSchema,
  notes: z.string().trim().max(2000, 'Keep the notes under 2000 characters').default(''),
  steps: z.array(PlanStepBody).max(DAY_LIMITS.maxSteps, `At most ${DAY_LIMITS.maxSteps} steps`),
})
export type SavePlanInput = z.infer<typeof SavePlanBody>

/** POST /api/bench-tests/:id/plan/copy: another bench test's plan replaces this one's (planned setups are created). */
export const CopyPlanBody = z.object({ fromBenchTestId: IdSchema, version: VersionSchema })

/** POST /api/bench-tests/:id/plan/day: one move of the day. */
export const DayActionBody = z.discriminatedUnion('action', [
  z.object({ action: z.literal('start'), stepId: IdSchema }),
  z.object({ action: z.literal('skip'), stepId: IdSchema }),
  z.object({ action: z.literal('tick'), stepId: IdSchema, itemId: z.string().regex(/^[a-z0-9]{1,16}$/), done: z.boolean() }),
])
export type DayAction = z.infer<typeof DayActionBody>

export interface ChecklistItem { id: string, text: string, done: boolean, doneAt: string | null }

export interface PlanStep {
  id: number
  position: number
  setupId: number
  setupLabel: string
  partsChange: string
  swapMinutes: number | null
  plannedPulls: number
  checklist: ChecklistItem[]
  startedAt: string | null
  skippedAt: string | null
}

export interface TestPlan {
  benchTestId: number
  /** 0 while the bench test has no plan. */
  version: number
  acceptance: Acceptance
  notes: string
  steps: PlanStep[]
  currentStepId: number | null
  dayStartedAt: string | null
  updatedAt: string | null
  updatedByName: string | null
}

export type StepStatus = 'waiting' | 'current' | 'done' | 'skipped'

/** A pull of the day with what the acceptance window says about it (empty: it counts). */
export interface DayPull { pull: PullSummary, flags: string[] }

export interface DayRepeat {
  includedPulls: number
  spreadPct: number | null
  /** true: enough to call it; false: make another pull; null: not enough pulls to say. */
  enough: boolean | null
  verdict: string
}

export interface DayStep extends PlanStep {
  status: StepStatus
  pulls: DayPull[]
  repeat: DayRepeat
  /** From the step's start to its first pull, minutes; null until both are known. */
  swapMinutesActual: number | null
}

/** One line of "plan against what happened". */
export interface DayReportRow {
  stepId: number
  setupLabel: string
  plannedPulls: number
  pullsMade: number
  pullsCounted: number
  swapMinutesPlanned: number | null
  swapMinutesActual: number | null
  outcome: 'done' | 'short' | 'skipped' | 'not reached'
}

export interface DayReport {
  rows: DayReportRow[]
  pullsPlanned: number
  pullsMade: number
  setupsSkipped: number
  /** Sentences fit to quote. */
  summary: string
}

/** GET /api/bench-tests/:id/day */
export interface DayView {
  plan: TestPlan
  /** The live change counter this view was read at (the event id of the stream). */
  seq: number
  steps: DayStep[]
  inboxWaiting: number
  report: DayReport
}

/** GET /api/upload/:token/plan: what the operator may see of the plan, nothing more. */
export interface OperatorPlanView {
  steps: { position: number, setupLabel: string, partsChange: string, plannedPulls: number, received: number, status: StepStatus, checklist: { text: string, done: boolean }[] }[]
  rpmFrom: number
  rpmTo: number
  /** The acceptance window as sentences for the cell. */
  window: string[]
  currentPosition: number | null
}
