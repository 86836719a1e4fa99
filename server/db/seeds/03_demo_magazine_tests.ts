import type { Knex } from 'knex'
import { planDemoCamDay } from '../demo/day-plan'
import { buildDemoMagazineTests } from '../demo/magazine-tests'

// The bench tests behind the demo magazine's season (and the cam test's day as
// planned and run, which its story quotes). Its photos and stories are made after
// the server starts, over the app's own HTTP API (scripts/demo/magazine.ts).
// The test run sets PULLSHEET_DEMO_STORIES=0: its tests make their own.
export async function seed(knex: Knex): Promise<void> {
  if (process.env.PULLSHEET_DEMO_STORIES === '0') return
  const writer = await knex('users').where({ email: 'writer@example.com' }).first('id')
  if (!writer) return
  await buildDemoMagazineTests(knex, Number(writer.id))
  await planDemoCamDay(knex, Number(writer.id))
}
