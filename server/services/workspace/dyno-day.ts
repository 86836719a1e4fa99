// The dyno day: the day view with each pull judged against the plan's acceptance
// window, the repeat verdicts and the plan against what happened, and what the
// operator's link shows of the plan. The plan itself is test-plans.ts; files are filed
// into the current step by dyno-day-filing.ts.
import type { Db } from '../../utils/db'
import type { CorrectionStandard } from '../../../shared/dyno/index'
import type { DayStep, DayView, OperatorPlanView, PlanStep, StepStatus, TestPlan } from '../../../shared/types/dyno-day'
import { acceptanceFlags, dayReport, minutesBetween, pullTemperatures, repeatVerdict } from '../../../shared/utils/dyno-day'
import { liveMark } from './live-marks'
import { decodePoints } from './pull-points'
import { pullSummaries, repeatabilityBySetup } from './pulls'
import { getTestPlan } from './test-plans'

function statusOf(plan: TestPlan, step: PlanStep, pullCount: number): StepStatus {
  if (step.skippedAt) return 'skipped'
  if (plan.currentStepId === step.id) return 'current'
  return pullCount > 0 || step.startedAt ? 'done' : 'waiting'
}

/** Temperatures of each pull, read from its stored points' extra channels. */
async function pullTemperatureMap(db: Db, pullIds: readonly number[]) {
  if (!pullIds.length) return new Map<number, ReturnType<typeof pullTemperatures>>()
  const rows = await db('pulls').whereIn('id', pullIds).select('id', 'points') as { id: number, points: string }[]
  return new Map(rows.map(r => [r.id, pullTemperatures(decodePoints(r.points, { extra: true }))]))
}

export async function getDayView(db: Db, benchTestId: number, standard: CorrectionStandard): Promise<DayView> {
  const seq = await liveMark(db, benchTestId)
  const plan = await getTestPlan(db, benchTestId)
  const setupIds = [...new Set(plan.steps.map(s => s.setupId))]
  const pulls = (await pullSummaries(db, benchTestId)).filter(p => setupIds.includes(p.setupId))
  const temps = await pullTemperatureMap(db, pulls.map(p => p.id))
  const repeat = new Map((await repeatabilityBySetup(db, setupIds, standard)).map(r => [r.setupId, r]))
  const steps: DayStep[] = plan.steps.map((step) => {
    const own = pulls.filter(p => p.setupId === step.setupId)
    const r = repeat.get(step.setupId)
    const t = temps.get(own[0]?.id ?? -1)
    return {
      ...step,
      status: statusOf(plan, step, own.length),
      pulls: own.map((pull) => {
        const tt = temps.get(pull.id) ?? t ?? { coolantF: null, oilF: null }
        return { pull, flags: acceptanceFlags({ rpmFrom: pull.rpmFrom, rpmTo: pull.rpmTo, weather: pull.weather, coolantF: tt.coolantF, oilF: tt.oilF }, plan.acceptance) }
      }),
      repeat: repeatVerdict(r?.includedPulls ?? 0, r?.spreadPct ?? null, plan.acceptance.repeatPct),
      swapMinutesActual: minutesBetween(step.startedAt, own[0]?.uploadedAt ?? null),
    }
  })
  const inboxWaiting = Number((await db('inbox_files').where({ bench_test_id: benchTestId, state: 'waiting' }).count({ n: '*' }).first() as { n: number | string }).n)
  const report = dayReport(steps.map(s => ({
    stepId: s.id, setupLabel: s.setupLabel, plannedPulls: s.plannedPulls, swapMinutes: s.swapMinutes, status: s.status,
    pullsMade: s.pulls.length, pullsCounted: s.pulls.filter(p => p.pull.included && p.flags.length === 0).length, swapMinutesActual: s.swapMinutesActual,
  })))
  return { plan, seq, steps, inboxWaiting, report }
}

/** What the operator's link shows of the plan: steps, counts and the window, no ids and no figures. */
export async function operatorPlanView(db: Db, benchTestId: number): Promise<OperatorPlanView | null> {
  const plan = await getTestPlan(db, benchTestId)
  if (plan.version === 0 || plan.steps.length === 0) return null
  const counts = new Map((await db('pulls').where({ bench_test_id: benchTestId }).groupBy('setup_id').select('setup_id', db.raw('COUNT(*) AS n')) as { setup_id: number, n: number | string }[]).map(r => [r.setup_id, Number(r.n)]))
  const a = plan.acceptance
  const window = [
    `Pull from ${a.rpmFrom} to ${a.rpmTo} rpm or wider.`,
    ...(a.coolantF ? [`Coolant ${a.coolantF.min}–${a.coolantF.max} F at the start of the pull.`] : []),
    ...(a.oilF ? [`Oil ${a.oilF.min}–${a.oilF.max} F.`] : []),
    ...(a.airTempF ? [`Air ${a.airTempF.min}–${a.airTempF.max} F.`] : []),
    ...(a.baroInHg ? [`Barometer ${a.baroInHg.min}–${a.baroInHg.max} inHg.`] : []),
    `Repeat pulls within ${a.repeatPct} percent of each other.`,
  ]
  const current = plan.steps.find(s => s.id === plan.currentStepId)
  return {
    steps: plan.steps.map(s => ({
      position: s.position,
      setupLabel: s.setupLabel,
      partsChange: s.partsChange,
      plannedPulls: s.plannedPulls,
      received: counts.get(s.setupId) ?? 0,
      status: statusOf(plan, s, counts.get(s.setupId) ?? 0),
      checklist: s.checklist.map(c => ({ text: c.text, done: c.done })),
    })),
    rpmFrom: a.rpmFrom,
    rpmTo: a.rpmTo,
    window,
    currentPosition: current?.position ?? null,
  }
}
