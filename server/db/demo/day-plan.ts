// The demo's planned dyno day: a bench test whose test plan is written but whose day
// has not started (no pulls yet), so a newcomer can open the plan, print the run sheet,
// start the day and send files through an operator link. The browser test of the whole
// day (tests/browser/dyno-day.test.ts) runs on it. Invented shop, parts and makers.
import type { Knex } from 'knex'
import type { SavePlanInput } from '../../../shared/types/dyno-day'
import { createBenchTest } from '../../services/workspace/bench-test-core'
import { putBuildSheet } from '../../services/workspace/build-sheets'
import { saveTestPlan } from '../../services/workspace/test-plans'
import { createSetup } from '../../services/workspace/setups'

export const DEMO_DAY_SLUG = 'three-cams-on-a-5-3-l-pushrod-v8-test-day'

const INVENTED = 'Demo data: the shop, the parts makers and the parts are invented.'

export async function buildDemoDayPlan(db: Knex, ownerId: number): Promise<number | null> {
  if (await db('bench_tests').where({ slug: DEMO_DAY_SLUG }).first('id')) return null
  const benchTest = await createBenchTest(db, ownerId, {
    title: 'Three cams on a 5.3 L pushrod V8: test day',
    engineFamily: 'pushrod-v8',
    partType: 'camshaft',
    shop: 'Halvorsen Engine Works (fictional)',
    dyno: 'Cell 1 eddy-current engine dyno',
    testedFrom: null,
    testedTo: null,
    notes: `Planned: the factory cam against two grinds, swapped in one day. ${INVENTED}`,
    defaultStandard: 'sae-j1349-1990',
  })
  await putBuildSheet(db, benchTest.id, {
    version: 0,
    boreIn: 3.78, strokeIn: 3.622, cylinders: 8, compressionRatio: 9.9,
    heads: 'Factory aluminium cathedral-port heads', induction: 'Factory EFI, 78 mm throttle body', fuel: '91 octane pump gasoline',
    ignition: 'Factory coil-near-plug', exhaust: '1 3/4 in long-tube headers into the cell exhaust', notes: INVENTED,
  })
  const baseline = await createSetup(db, benchTest.id, { label: 'Factory cam', description: 'As delivered.' })
  const plan: Omit<SavePlanInput, 'version'> = {
    acceptance: { rpmFrom: 3000, rpmTo: 6000, coolantF: { min: 175, max: 200 }, oilF: null, airTempF: null, baroInHg: null, repeatPct: 1 },
    notes: 'Warm-up pull first, not recorded. Same fuel, timing and headers for every cam.',
    steps: [
      { setupId: baseline.id, partsChange: 'None: the engine as delivered', swapMinutes: null, plannedPulls: 2, checklist: [{ text: 'Warm the coolant to 180 F' }, { text: 'Check the fuel pressure at idle' }] },
      { setupId: null, newSetupLabel: 'Cam B: mid-range grind', partsChange: 'Swap the camshaft for the mid-range grind (invented maker)', swapMinutes: 90, plannedPulls: 2, checklist: [{ text: 'Degree the cam' }, { text: 'Check the lifter preload' }, { text: 'Look for leaks at the front cover' }] },
      { setupId: null, newSetupLabel: 'Cam C: top-end grind', partsChange: 'Swap the camshaft for the top-end grind (invented maker)', swapMinutes: 90, plannedPulls: 2, checklist: [{ text: 'Degree the cam' }, { text: 'Check piston-to-valve clearance' }] },
    ],
  }
  await saveTestPlan(db, ownerId, benchTest.id, { version: 0, ...plan })
  return benchTest.id
}

export const DEMO_CAM_TEST_SLUG = 'three-camshafts-in-a-5-7-l-pushrod-v8'

/**
 * The magazine's cam test as it was run: a plan of four cams, three pulls each, 75
 * minutes planned per swap, and the swaps as long as they took on the (invented) day,
 * so its story can quote the plan against what happened. The pulls were imported
 * by the seed a moment ago: each swap's start is set that many minutes before its
 * first pull, which is all the report reads.
 */
export async function planDemoCamDay(db: Knex, ownerId: number): Promise<void> {
  const bench = await db('bench_tests').where({ slug: DEMO_CAM_TEST_SLUG }).first('id')
  if (!bench || await db('test_plans').where({ bench_test_id: bench.id }).first('bench_test_id')) return
  const setups = await db('setups').where({ bench_test_id: bench.id }).whereNull('deleted_at').orderBy('position').select('id', 'label') as { id: number, label: string }[]
  const swapTook = [null, 82, 71, 94]
  const plan = await saveTestPlan(db, ownerId, Number(bench.id), {
    version: 0,
    acceptance: { rpmFrom: 2500, rpmTo: 6500, coolantF: null, oilF: null, airTempF: null, baroInHg: null, repeatPct: 1 },
    notes: 'Idle vacuum at 750 rpm before each cam\'s pulls.',
    steps: setups.map((s, i) => ({
      setupId: s.id,
      partsChange: i === 0 ? 'None: the production cam' : `Swap the camshaft for the ${s.label}`,
      swapMinutes: i === 0 ? null : 75,
      plannedPulls: 3,
      checklist: i === 0 ? [{ text: 'Read idle vacuum at 750 rpm' }] : [{ text: 'Degree the cam' }, { text: 'Check the lifter preload' }, { text: 'Read idle vacuum at 750 rpm' }],
    })),
  })
  for (const [i, step] of plan.steps.entries()) {
    const took = swapTook[i]
    if (took === undefined || took === null) continue
    const first = await db('pulls').where({ setup_id: step.setupId }).orderBy('id').first('uploaded_at') as { uploaded_at: Date } | undefined
    if (!first) continue
    await db('test_plan_steps').where({ id: step.id }).update({ started_at: new Date(new Date(first.uploaded_at).getTime() - took * 60_000) })
  }
  await db('test_plans').where({ bench_test_id: bench.id }).update({ day_started_at: db.raw('(SELECT MIN(uploaded_at) FROM pulls WHERE bench_test_id = ?)', [bench.id]) })
}
