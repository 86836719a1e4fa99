import type { Knex } from 'knex'
import { buildDemoBenchTests } from '../demo/bench-tests'
import { buildDemoDayPlan } from '../demo/day-plan'

// The demo workspace of the fictional magazine, owned by the demo writer: tested
// bench tests with their pulls, and one whose dyno day is planned but not yet run.
export async function seed(knex: Knex): Promise<void> {
  const writer = await knex('users').where({ email: 'writer@example.com' }).first('id')
  if (!writer) return
  await buildDemoBenchTests(knex, Number(writer.id))
  await buildDemoDayPlan(knex, Number(writer.id))
}
