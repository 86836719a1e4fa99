import type { Knex } from 'knex'

// One published demo story on the demo header test, so a fresh `npm start` shows
// readers a real page with live figures. Every name in it is invented. The test
// run sets PULLSHEET_DEMO_STORIES=0: its tests make their own stories.
const SLUG = 'long-tubes-on-the-6-3-what-the-pulls-say'
const BENCH_TEST_SLUG = 'long-tube-headers-on-a-6-3-l-pushrod-v8'

function body(stock: number, small: number, large: number): string {
  return `The header question comes up on every pushrod V8 build: do long tubes pay on an engine that is otherwise stock? We put the fictional shop's 6.3 L test engine on the dyno with its cast manifolds, then two sizes of long-tube headers, three pulls each, every pull corrected to the same standard atmosphere.

::pull-graph{setups="${stock},${small},${large}" channel="power" from=3000 to=6500}
::

The smaller tubes gave :figure-value{of="peak-power-gain" setup=${small} vs=${stock}} peak to peak over the manifolds, and the larger ones :figure-value{of="peak-power-gain" setup=${large} vs=${stock}}. Averaged over the band all three cover, the larger set was worth :figure-value{of="average-power-gain" setup=${large} vs=${stock}}.

::gain-graph{baseline=${stock} setups="${small},${large}"}
::

Torque tells the rest. The larger primaries peaked at :figure-value{of="peak-torque" setup=${large}} and held on longer; where the curves cross matters more on the street than the peak does.

::results-table{setups="${stock},${small},${large}"}
::

## The engine

::spec-box
::

::cautions
::

*All names, shops and parts in this story are invented for the Pullsheet demo; the pulls are synthetic.*`
}

export async function seed(knex: Knex): Promise<void> {
  if (process.env.PULLSHEET_DEMO_STORIES === '0') return
  if (await knex('stories').where({ slug: SLUG }).first('id')) return
  const writer = await knex('users').where({ email: 'writer@example.com' }).first('id')
  const editor = await knex('users').where({ email: 'editor@example.com' }).first('id')
  const bench = await knex('bench_tests').where({ slug: BENCH_TEST_SLUG }).whereNull('deleted_at').first('id', 'engine_family', 'part_type')
  if (!writer || !editor || !bench) return
  const setups = await knex('setups').where({ bench_test_id: bench.id }).whereNull('deleted_at').orderBy('position').select('id')
  if (setups.length < 3) return
  const [stock, small, large] = setups.map(s => Number(s.id)) as [number, number, number]

  await knex.transaction(async (trx) => {
    const [storyId] = await trx('stories').insert({
      bench_test_id: bench.id,
      slug: SLUG,
      headline: 'Long tubes on the 6.3: what the pulls say',
      deck: 'Cast manifolds against two sizes of long-tube headers on a stock pushrod V8, three corrected pulls each.',
      body: body(stock, small, large),
      engine_family: bench.engine_family,
      part_type: bench.part_type,
      search_title: 'Long-tube headers on a 6.3 L pushrod V8, tested',
      search_description: 'Dyno test of stock manifolds against two long-tube header sizes (fictional demo).',
      state: 'published',
      state_changed_at: trx.raw('NOW(3)'),
      published_at: trx.raw('NOW(3)'),
      created_by: writer.id,
    })
    await trx('story_bylines').insert({ story_id: storyId, user_id: writer.id, position: 0 })
    await trx('story_tags').insert(['headers', 'exhaust', 'pushrod-v8'].map((tag, position) => ({ story_id: storyId, tag, position })))
    const moves = [
      ['submit', 'draft', 'in_review', writer.id],
      ['approve', 'in_review', 'approved', editor.id],
      ['publish_now', 'approved', 'published', editor.id],
    ] as const
    for (const [action, from, to, userId] of moves) {
      await trx('story_transitions').insert({ story_id: storyId, action, from_state: from, to_state: to, user_id: userId, note: 'Demo story (invented).' })
    }
  })
}
