// The demo's planned dyno day: a bench test whose test plan is written but whose day
// has not started (no pulls yet), so a newcomer can open the plan, print the run sheet,
// start the day and send files through an operator link. The browser test of the whole
// day (tests/browser/dyno-day.test.ts) runs on it. Invented shop, parts and makers.
import type { Knex } from 'knex'
import type { SavePlanInput } from '../../../shared/types/dyno-day'
import { createBenchTest } from '../../utils/bench-test-core'
import { putBuildSheet } from '../../utils/build-sheets'
import { saveTestPlan } from '../../utils/dyno-day'
import { createSetup } from '../../utils/setups'

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
