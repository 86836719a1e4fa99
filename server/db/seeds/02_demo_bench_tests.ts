import type { Knex } from 'knex'
import { buildDemoBenchTests } from '../demo/bench-tests'

// The demo workspace of the fictional magazine, owned by the demo writer.
export async function seed(knex: Knex): Promise<void> {
  const writer = await knex('users').where({ email: 'writer@example.com' }).first('id')
  if (!writer) return
  await buildDemoBenchTests(knex, Number(writer.id))
}
