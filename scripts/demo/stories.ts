// The demo magazine's stories: one per bench test, each with the state it ends in,
// its photos and its words. Every number a reader sees in the prose is an inline
// figure computed from the pulls (:figure-value), never typed in; where the prose
// makes a claim about the data (idle vacuum falls as duration grows, the manifolds
// cross, the gain is inside repeatability), `check` tests that claim against the
// analysis first and the seed stops if it does not hold. All names are invented.
import type { AnalysisResponse, AnalysisRow } from '../../shared/types/analysis-results'
import { DEMO_BENCH_TESTS } from '../../server/db/demo/bench-tests'
import { DEMO_MAGAZINE_TESTS } from '../../server/db/demo/magazine-tests'
import type { PhotoScene } from './photo-scenes'

export type DemoEnd = 'published' | 'withdrawn' | 'in_review' | 'changes_requested' | 'approved' | 'scheduled' | 'draft'

export interface DemoPhoto {
  scene: PhotoScene
  caption: string
  credit: string
  altText: string
  /** The hero is drawn larger (it gets the widest web size). */
  hero?: boolean
}

export interface StoryContext {
  /** Setup ids in the bench test's order (baseline first). */
  s: number[]
  /** Photo ids in the order of `photos` (hero first). */
  p: number[]
}

export interface DemoStory {
  benchTestSlug: string
  end: DemoEnd
  /** Days before the demo's "today" it was published (published and withdrawn only). */
  publishedDaysAgo?: number
  /** Hours before now it last changed state (the stories still on the desk). */
  movedHoursAgo?: number
  headline: string
  deck: string
  tags: string[]
  /** A second writer shares the byline. */
  coByline?: boolean
  photos: DemoPhoto[]
  body: (c: StoryContext) => string
  /** A claim of the prose that the data must bear out; returns what is wrong, or null. */
  check?: (analysis: AnalysisResponse, c: StoryContext) => string | null
  /** Notes of the desk (first is the editor's; `reply` is the writer's answer). */
  notes?: { body: string, anchor?: string, reply?: string }[]
  /** The editor's note when asking for changes or withdrawing. */
  moveNote?: string
}

const CREDIT_STAFF = 'Sump & Sprocket staff (drawn for the demo)'
const CREDIT_SHOP = 'The test shop (drawn for the demo)'
const INVENTED = '*All names, shops, parts makers and parts in this story are invented for the Pullsheet demo, and the pulls are synthetic.*'

const fv = (of: string, setup: number, vs?: number) => `:figure-value{of="${of}" setup=${setup}${vs === undefined ? '' : ` vs=${vs}`}}`

function row(a: AnalysisResponse, setupId: number): AnalysisRow {
  const found = a.table.rows.find(r => r.setupId === setupId)
  if (!found) throw new Error(`setup ${setupId} is not in the analysis`)
  return found
}

/** The dyno computer's screen showing the bench test's own curves (the model's, noiseless). */
function screenOf(slug: string, seed: number, setupIndexes?: number[]): PhotoScene {
  const test = [...DEMO_BENCH_TESTS, ...DEMO_MAGAZINE_TESTS].find(t => t.slug === slug)
  if (!test) throw new Error(`demo seed: no demo bench test ${slug}`)
  const setups = setupIndexes ? setupIndexes.map(i => test.setups[i]!) : test.setups
  return { kind: 'screen', models: setups.map(s => s.model), fromRpm: test.rpm.from, toRpm: test.rpm.to, seed }
}

function gallery(c: StoryContext, from = 1): string {
  return `::gallery{ids="${c.p.slice(from).join(',')}"}\n::`
}

export const DEMO_STORIES: DemoStory[] = [
  {
    benchTestSlug: 'three-camshafts-in-a-5-7-l-pushrod-v8',
    end: 'published',
    publishedDaysAgo: 3,
    headline: 'Four cams, one 5.7: what each degree of duration costs at idle',
    deck: 'The production cam and three street grinds of growing duration on a pushrod V8. Power climbs with every step; idle vacuum falls with it.',
    tags: ['camshaft', 'idle-vacuum', 'pushrod-v8'],
    coByline: true,
    photos: [
      { hero: true, scene: { kind: 'engine', cylinders: 8, layout: 'v', accent: 'signal', seed: 301 }, caption: 'The 5.7 on the stand in bay 1, between cam swaps.', credit: CREDIT_STAFF, altText: 'A V8 engine with orange valve covers on an engine stand in a dyno cell, headers sweeping down to the floor.' },
      { scene: { kind: 'bench', part: 'camshaft', count: 3, seed: 302 }, caption: 'The three test cams, shortest duration on the left.', credit: CREDIT_STAFF, altText: 'Three camshafts side by side on a wooden workbench in front of a pegboard.' },
      { scene: screenOf('three-camshafts-in-a-5-7-l-pushrod-v8', 303, [0, 2]), caption: 'Production cam against the 226 grind on the dyno screen.', credit: CREDIT_SHOP, altText: 'A monitor in a dark control room showing two power curves that cross over a grid.' },
    ],
    body: (c) => {
      const [stock, c214, c226, c238] = c.s as [number, number, number, number]
      return `Every cam catalogue promises power; few print what the bigger grind does to the engine at a stoplight. We ran the production cam in our fictional shop's 5.7 L test engine, then three hydraulic-roller grinds from one invented cam maker, each 12 degrees longer at 0.050 in than the last, all on 110 degree lobe centers. Idle vacuum was read at the same idle speed before each cam's pulls.

::pull-graph{setups="${stock},${c214},${c226},${c238}" channel="power"}
::

The power is there. The 214 cam made ${fv('peak-power-gain', c214, stock)} peak to peak over the production cam, the 226 made ${fv('peak-power-gain', c226, stock)}, and the 238 made ${fv('peak-power-gain', c238, stock)}, with its peak moving up to ${fv('peak-power-rpm', c238)}.

## What it costs

Idle vacuum went the other way with every step: ${fv('idle-vacuum', stock)} with the production cam, ${fv('idle-vacuum', c214)} with the 214, ${fv('idle-vacuum', c226)} with the 226 and ${fv('idle-vacuum', c238)} with the 238, a change of ${fv('idle-vacuum-change', c238, stock)}. That is the drivability bill: a lumpier idle, a vacuum brake booster with less to work with, and a carburetor or calibration that has to be re-tuned for it.

::gain-graph{baseline=${stock} setups="${c214},${c226},${c238}" channel="torque"}
::

Below ${fv('torque-crossover-rpm', c238, stock)} the longest cam gives torque back: its largest loss against the production cam was ${fv('largest-torque-loss', c238, stock)}. On a street car that spends its life below that, the 214 or the 226 is the better trade.

::cam-card{setup=${c226}}
::

::results-table
::

${gallery(c)}

## The day

We planned the four cams for one day in bay 1, three pulls each and 75 minutes a swap. How it went:

::day-report
::

## The engine

::spec-box
::

::cautions
::

${INVENTED}`
    },
    check: (a, { s: [stock, ...cams] }) => {
      const rows = [stock!, ...cams].map(id => row(a, id))
      for (let i = 1; i < rows.length; i++) {
        if (!(rows[i]!.idleVacuumInHg! < rows[i - 1]!.idleVacuumInHg!)) return `idle vacuum does not fall from ${rows[i - 1]!.label} to ${rows[i]!.label}`
        if (!(rows[i]!.peakPower.value > rows[i - 1]!.peakPower.value)) return `peak power does not rise from ${rows[i - 1]!.label} to ${rows[i]!.label}`
      }
      const loss = rows.at(-1)!.vsBaseline!.largestLoss.torque
      const crossing = rows.at(-1)!.vsBaseline!.crossovers.torqueRpm
      if (!(loss.value < 0 && crossing.length === 1 && loss.rpm < crossing[0]!)) return 'the longest cam does not lose torque below one crossover'
      return null
    },
  },
  {
    benchTestSlug: 'dual-plane-or-single-plane-on-a-6-6-l-v8',
    end: 'published',
    publishedDaysAgo: 10,
    headline: 'Dual-plane or single-plane: where the 6.6 trades torque for top end',
    deck: 'Two intake manifolds on one carbureted big V8. The open single-plane wins at the top and pays for it below a crossover we can name.',
    tags: ['intake-manifold', 'carburetor', 'pushrod-v8'],
    photos: [
      { hero: true, scene: { kind: 'bench', part: 'intake', count: 2, seed: 311 }, caption: 'The dual-plane (left) and the single-plane before the swap.', credit: CREDIT_STAFF, altText: 'Two aluminium intake manifolds side by side on a workbench.' },
      { scene: { kind: 'engine', cylinders: 8, layout: 'v', accent: 'gauge', seed: 312 }, caption: 'The 6.6 with the single-plane and the test carburetor fitted.', credit: CREDIT_STAFF, altText: 'A V8 engine with teal valve covers and a carburetor on top, on a stand in the dyno cell.' },
      { scene: screenOf('dual-plane-or-single-plane-on-a-6-6-l-v8', 313), caption: 'The two manifolds overlaid on the control-room screen.', credit: CREDIT_SHOP, altText: 'A monitor showing two sets of curves that cross near the middle of the rpm range.' },
    ],
    body: (c) => {
      const [dual, single] = c.s as [number, number]
      return `A dual-plane manifold splits the carburetor's plenum in two and gives each half long, winding runners; a single-plane opens one plenum to all eight short runners. The first is built for torque in the middle, the second for air at the top. We ran both on the same 6.6 L engine with the same 850 cfm carburetor, jetting and timing.

::pull-graph{setups="${dual},${single}" channel="both"}
::

## The crossover

Below ${fv('torque-crossover-rpm', single, dual)} the dual-plane makes more torque; above it the single-plane takes over. At the bottom of the pull the single-plane gave up as much as ${fv('largest-torque-loss', single, dual)}, and at the top it gained as much as ${fv('largest-power-gain', single, dual)} at ${fv('largest-power-gain-rpm', single, dual)}.

::gain-graph{baseline=${dual} setups="${single}" channel="both"}
::

Peak to peak, the single-plane was worth ${fv('peak-power-gain', single, dual)}, but averaged across the whole pull the difference was ${fv('average-power-gain', single, dual)}. Which one is better depends on where the engine lives: a heavy street car that sees 6,000 rpm once a week wants the dual-plane; a car geared to stay above the crossover wants the single-plane.

::results-table
::

${gallery(c)}

## The engine

::spec-box
::

::cautions
::

${INVENTED}`
    },
    check: (a, { s: [dual, single] }) => {
      const g = row(a, single!).vsBaseline
      if (!g || g.crossovers.torqueRpm.length !== 1) return 'the manifolds do not cross exactly once in torque'
      if (!(g.largestLoss.torque.value < 0 && g.largestLoss.torque.rpm < g.crossovers.torqueRpm[0]!)) return 'the single-plane does not lose torque below the crossover'
      if (!(g.largestGain.power.value > 0 && g.largestGain.power.rpm > g.crossovers.torqueRpm[0]!)) return 'the single-plane does not gain power above the crossover'
      if (!(g.peakPower > 0)) return 'the single-plane does not make more peak power'
      return dual ? null : 'no dual-plane setup'
    },
  },
  {
    benchTestSlug: 'a-68-mm-throttle-body-on-a-4-2-l-inline-six',
    end: 'published',
    publishedDaysAgo: 17,
    headline: 'A bigger throttle on the 4.2 six: inside the noise',
    deck: 'A 68 mm throttle body against the factory 62 mm on an otherwise stock inline six. Three pulls each, and the difference is smaller than the scatter between them.',
    tags: ['throttle-body', 'repeatability', 'inline-six'],
    photos: [
      { hero: true, scene: { kind: 'engine', cylinders: 6, layout: 'inline', accent: 'gauge', seed: 321 }, caption: 'The 4.2 inline six on the co-op\'s eddy-current dyno.', credit: CREDIT_STAFF, altText: 'An inline six-cylinder engine with a long teal valve cover on an engine stand.' },
      { scene: { kind: 'bench', part: 'throttle-body', count: 2, seed: 322 }, caption: 'Factory 62 mm (left) and the 68 mm billet throttle body.', credit: CREDIT_STAFF, altText: 'Two round throttle bodies of different sizes on a workbench.' },
      { scene: screenOf('a-68-mm-throttle-body-on-a-4-2-l-inline-six', 323), caption: 'Two curves that lie on top of each other.', credit: CREDIT_SHOP, altText: 'A monitor showing two nearly identical power curves.' },
    ],
    body: (c) => {
      const [small, big] = c.s as [number, number]
      return `Bigger throttle bodies are an easy sell: a bigger hole must flow more. On an engine whose 62 mm factory throttle is not the restriction, though, there may be nothing to find. We alternated the two throttle bodies on the co-op's 4.2 L six, three pulls each, with the same calibration.

::pull-graph{setups="${small},${big}" channel="power"}
::

The 68 mm unit's peak-to-peak result reads ${fv('peak-power-gain', big, small)}, and its average over the pull ${fv('average-power-gain', big, small)}. Both are smaller than the spread between repeat pulls of the same setup, so this test cannot tell the two apart: whatever the bigger throttle does on this engine, it is inside the dyno's repeatability. We would not pay for it on a stock six.

::gain-graph{baseline=${small} setups="${big}" channel="power"}
::

::results-table
::

${gallery(c)}

## The engine

::spec-box
::

::cautions
::

${INVENTED}`
    },
    check: (a, { s: [, big] }) => {
      const r = row(a, big!).vsBaseline?.withinRepeatability
      if (r?.peakPower !== true || r.averagePower !== true) return `the 68 mm gain is not inside repeatability (peak ${r?.peakPower}, average ${r?.averagePower})`
      return null
    },
  },
  {
    benchTestSlug: 'long-tube-headers-on-a-6-3-l-pushrod-v8',
    end: 'published',
    publishedDaysAgo: 26,
    headline: 'Long tubes on the 6.3: what the pulls say',
    deck: 'Cast manifolds against two sizes of long-tube headers on a stock pushrod V8, three corrected pulls each.',
    tags: ['headers', 'exhaust', 'pushrod-v8'],
    photos: [
      { hero: true, scene: { kind: 'bench', part: 'headers', count: 2, seed: 331 }, caption: 'The 1 3/4 and 1 7/8 in long-tube sets before fitting.', credit: CREDIT_STAFF, altText: 'Two sets of stainless long-tube headers on a workbench.' },
      { scene: { kind: 'engine', cylinders: 8, layout: 'v', accent: 'signal', seed: 332 }, caption: 'The 6.3 on the stand in cell 2 with the smaller headers.', credit: CREDIT_SHOP, altText: 'A V8 engine on a stand with long header tubes running down towards the floor.' },
      { scene: screenOf('long-tube-headers-on-a-6-3-l-pushrod-v8', 333), caption: 'Manifolds and both header sizes on the screen.', credit: CREDIT_SHOP, altText: 'A monitor showing three power curves.' },
    ],
    body: (c) => {
      const [stock, small, large] = c.s as [number, number, number]
      return `The header question comes up on every pushrod V8 build: do long tubes pay on an engine that is otherwise stock? We put the fictional shop's 6.3 L test engine on the dyno with its cast manifolds, then two sizes of long-tube headers, three pulls each, every pull corrected to the same standard atmosphere.

::pull-graph{setups="${stock},${small},${large}" channel="power" from=3000 to=6500}
::

The smaller tubes gave ${fv('peak-power-gain', small, stock)} peak to peak over the manifolds, and the larger ones ${fv('peak-power-gain', large, stock)}. Averaged over the band all three cover, the larger set was worth ${fv('average-power-gain', large, stock)}.

::gain-graph{baseline=${stock} setups="${small},${large}"}
::

Torque tells the rest. The larger primaries peaked at ${fv('peak-torque', large)} and held on longer; where the curves cross matters more on the street than the peak does.

::results-table{setups="${stock},${small},${large}"}
::

${gallery(c)}

## The engine

::spec-box
::

::cautions
::

${INVENTED}`
    },
  },
  {
    benchTestSlug: 'timing-sweep-on-a-4-2-l-inline-six',
    end: 'published',
    publishedDaysAgo: 40,
    headline: 'Timing sweep on the 4.2 six: four degrees pay, four more do not',
    deck: 'Total advance of 28, 32 and 36 degrees, locked, on an inline six at a high-altitude shop. Pulls made from a cool morning into a warm afternoon, corrected.',
    tags: ['ignition-timing', 'inline-six'],
    photos: [
      { hero: true, scene: { kind: 'engine', cylinders: 6, layout: 'inline', accent: 'signal', seed: 341 }, caption: 'The six ready for its first pull of the morning.', credit: CREDIT_STAFF, altText: 'An inline six-cylinder engine with an orange valve cover on a stand in the dyno cell.' },
      { scene: { kind: 'bench', part: 'distributor', count: 1, seed: 342 }, caption: 'Ignition parts laid out before the sweep.', credit: CREDIT_STAFF, altText: 'An ignition part with wires fanning out, on a workbench.' },
      { scene: screenOf('timing-sweep-on-a-4-2-l-inline-six', 343), caption: 'The three timing settings overlaid.', credit: CREDIT_SHOP, altText: 'A monitor showing three power curves, two nearly on top of each other.' },
    ],
    body: (c) => {
      const [t28, t32, t36] = c.s as [number, number, number]
      return `Timing is free power until it is not. We locked the co-op's 4.2 L six at 28, 32 and 36 degrees total and made three pulls at each, watching for knock on every one. The cell warmed steadily from the first pull to the last, and the shop sits high enough that the barometer read well below sea level, so every figure here is corrected to the same standard day.

::pull-graph{setups="${t28},${t32},${t36}" channel="torque"}
::

From 28 to 32 degrees the six gained ${fv('peak-torque-gain', t32, t28)} of peak torque and ${fv('average-power-gain', t32, t28)} averaged over the pull. From 32 to 36 it gained ${fv('peak-power-gain', t36, t32)} at the peak: we stopped there, with no knock heard, because the return had all but run out.

::gain-graph{baseline=${t28} setups="${t32},${t36}"}
::

::results-table
::

${gallery(c)}

## The engine

::spec-box
::

::cautions
::

${INVENTED}`
    },
  },
  {
    benchTestSlug: '650-750-or-850-cfm-on-a-5-7-l-v8',
    end: 'published',
    publishedDaysAgo: 54,
    headline: '650, 750 or 850 cfm: sizing a carburetor for a 5.7',
    deck: 'Three carburetors of one family, each jetted for best power, on a mild 5.7 L V8. The middle one is the pick.',
    tags: ['carburetor', 'pushrod-v8'],
    photos: [
      { hero: true, scene: { kind: 'bench', part: 'carburetor', count: 3, seed: 351 }, caption: 'The three test carburetors, smallest on the left.', credit: CREDIT_STAFF, altText: 'Three four-barrel carburetors lined up on a workbench.' },
      { scene: { kind: 'engine', cylinders: 8, layout: 'v', accent: 'gauge', seed: 352 }, caption: 'The 5.7 in cell 2 with the 750 fitted.', credit: CREDIT_SHOP, altText: 'A V8 with teal valve covers and a carburetor on a stand.' },
      { scene: screenOf('650-750-or-850-cfm-on-a-5-7-l-v8', 353), caption: 'The three carburetors on the screen.', credit: CREDIT_SHOP, altText: 'A monitor showing three close power curves.' },
    ],
    body: (c) => {
      const [c650, c750, c850] = c.s as [number, number, number]
      return `Carburetor sizing rules of thumb give a number; the dyno gives a curve. We ran three four-barrels of one invented family on a mild 5.7, each jetted for best power on the day.

::pull-graph{setups="${c650},${c750},${c850}" channel="power"}
::

The 750 made ${fv('peak-power-gain', c750, c650)} more than the 650 at the peak, and ${fv('average-power-gain', c750, c650)} averaged across the pull. The 850 found only ${fv('peak-power-gain', c850, c750)} more than the 750 at the peak and gave back as much as ${fv('largest-torque-loss', c850, c750)} of torque lower down, where a street engine spends its time.

::gain-graph{baseline=${c650} setups="${c750},${c850}"}
::

::results-table
::

${gallery(c)}

## The engine

::spec-box
::

::cautions
::

${INVENTED}`
    },
    check: (a, { s: [, c750, c850] }) => {
      const g = row(a, c850!).vsPrevious
      if (!g || !(g.peakPowerPct < 2)) return 'the 850 gains 2 percent or more over the 750 at the peak'
      if (!(g.largestLoss.torque.value < 0)) return 'the 850 loses no torque against the 750'
      return c750 ? null : 'no 750 setup'
    },
  },
  {
    benchTestSlug: 'a-free-flowing-downpipe-on-a-2-0-l-turbo-four',
    end: 'published',
    publishedDaysAgo: 68,
    headline: 'A 3 in downpipe on the 2.0 turbo: more from the same boost',
    deck: 'Factory downpipe against a mandrel-bent one with a high-flow converter, boost held at the factory target. Pulls made on a humid day.',
    tags: ['downpipe', 'turbo', 'ohc-four'],
    photos: [
      { hero: true, scene: { kind: 'engine', cylinders: 4, layout: 'inline', accent: 'signal', seed: 361 }, caption: 'The turbo four on the lab\'s eddy-current dyno.', credit: CREDIT_STAFF, altText: 'A four-cylinder engine with an orange cover on a stand in a dyno cell.' },
      { scene: { kind: 'bench', part: 'downpipe', count: 2, seed: 362 }, caption: 'Factory downpipe and the 3 in replacement.', credit: CREDIT_STAFF, altText: 'Two bent exhaust pipes of different diameters on a workbench.' },
      { scene: screenOf('a-free-flowing-downpipe-on-a-2-0-l-turbo-four', 363), caption: 'Both downpipes on the control-room screen.', credit: CREDIT_SHOP, altText: 'A monitor showing two power curves, one above the other at high rpm.' },
    ],
    body: (c) => {
      const [stock, dp] = c.s as [number, number]
      return `On a turbocharged engine the exhaust after the turbine is back pressure the turbo has to push against. With boost held at the factory target, a freer downpipe should let the engine make the same boost with less work. We ran the factory part and a 3 in mandrel-bent downpipe with a high-flow converter on the lab's 2.0 L four.

::pull-graph{setups="${stock},${dp}" channel="both"}
::

The bigger pipe was worth ${fv('peak-power-gain', dp, stock)} at the peak and ${fv('average-power-gain', dp, stock)} on average, with the largest gain, ${fv('largest-power-gain', dp, stock)}, at ${fv('largest-power-gain-rpm', dp, stock)}.

::gain-graph{baseline=${stock} setups="${dp}"}
::

::results-table
::

${gallery(c)}

## The engine

::spec-box
::

::cautions
::

${INVENTED}`
    },
  },
  {
    benchTestSlug: 'intake-and-throttle-body-on-a-2-0-l-turbo-four',
    end: 'published',
    publishedDaysAgo: 82,
    headline: 'Runners and a bigger throttle on the 2.0 turbo four',
    deck: 'A runner-tuned cast manifold, then a 70 mm throttle body on top of it. The manifold does the work; the throttle adds a little at the top.',
    tags: ['intake-manifold', 'throttle-body', 'turbo', 'ohc-four'],
    photos: [
      { hero: true, scene: { kind: 'bench', part: 'intake', count: 1, seed: 371 }, caption: 'The runner-tuned manifold before fitting.', credit: CREDIT_STAFF, altText: 'A cast aluminium intake manifold on a workbench.' },
      { scene: { kind: 'engine', cylinders: 4, layout: 'inline', accent: 'gauge', seed: 372 }, caption: 'The turbo four with the new manifold on.', credit: CREDIT_SHOP, altText: 'A four-cylinder engine with a teal cover on a stand.' },
      { scene: { kind: 'bench', part: 'throttle-body', count: 2, seed: 373 }, caption: 'The 60 mm factory throttle body and the 70 mm one.', credit: CREDIT_STAFF, altText: 'Two round throttle bodies on a workbench.' },
    ],
    body: (c) => {
      const [stock, manifold, throttle] = c.s as [number, number, number]
      return `The lab's 2.0 L turbo four writes its files in metric; Pullsheet reads them as they are and shows them in the reader's units. The factory composite manifold came off first, replaced by a cast manifold with longer runners and a bigger plenum; then a 70 mm throttle body went on top of it.

::pull-graph{setups="${stock},${manifold},${throttle}" channel="power"}
::

The manifold alone gained ${fv('peak-power-gain', manifold, stock)} peak to peak and ${fv('average-power-gain', manifold, stock)} on average. The bigger throttle body on top of it added ${fv('peak-power-gain', throttle, manifold)} at the peak.

::gain-graph{baseline=${stock} setups="${manifold},${throttle}"}
::

::results-table
::

${gallery(c)}

## The engine

::spec-box
::

::cautions
::

${INVENTED}`
    },
  },
  {
    benchTestSlug: 'ported-heads-on-a-3-8-l-v6',
    end: 'withdrawn',
    publishedDaysAgo: 96,
    headline: 'Ported heads on the 3.8 V6',
    deck: 'Factory heads against the same castings hand-ported.',
    tags: ['cylinder-heads', 'v6'],
    photos: [
      { hero: true, scene: { kind: 'bench', part: 'heads', count: 2, seed: 381 }, caption: 'Factory and ported heads side by side.', credit: CREDIT_STAFF, altText: 'Two cylinder heads on a workbench.' },
    ],
    body: (c) => {
      const [stock, ported] = c.s as [number, number]
      return `We ran the invented head shop's port work on a 3.8 L V6.

::pull-graph{setups="${stock},${ported}"}
::

The ported heads gained ${fv('peak-power-gain', ported, stock)} at the peak.

::results-table
::

::cautions
::

${INVENTED}`
    },
    moveNote: 'Withdrawn: the shop found a vacuum leak on the baseline pulls, so the gain is overstated. A corrected test will follow.',
  },
  {
    benchTestSlug: 'equal-length-headers-on-a-2-5-l-flat-four',
    end: 'in_review',
    movedHoursAgo: 5,
    headline: 'Equal-length headers on the 2.5 flat four',
    deck: 'The factory unequal-length manifold against equal-length headers: more power, less burble.',
    tags: ['headers', 'flat-four'],
    photos: [],
    body: (c) => {
      const [stock, eq] = c.s as [number, number]
      return `The flat four's factory manifold pairs long and short runners, which gives the engine its burble and costs it some top end. Equal-length headers fix the first and, on the dyno, the second.

::pull-graph{setups="${stock},${eq}"}
::

The headers were worth ${fv('peak-power-gain', eq, stock)} at the peak and ${fv('average-power-gain', eq, stock)} on average.

::results-table
::

::cautions
::

${INVENTED}`
    },
    notes: [
      { anchor: 'costs it some top end', body: 'Can we say how much top end, with a number from the table, rather than "some"?', reply: 'Yes: I will add the largest gain and its rpm in the next pass.' },
      { body: 'Needs photos: the headers on the bench and on the engine. And add the build sheet box.' },
    ],
  },
  {
    benchTestSlug: 'bigger-intake-cams-in-a-5-0-l-overhead-cam-v8',
    end: 'changes_requested',
    movedHoursAgo: 28,
    headline: 'Bigger intake cams in the 5.0 overhead-cam V8',
    deck: 'Eighteen more degrees on the intake side, cam timing left on the factory map.',
    tags: ['camshaft', 'ohc-v8'],
    photos: [],
    body: (c) => {
      const [stock, cams] = c.s as [number, number]
      return `Longer intake cams on an overhead-cam V8 with the factory cam timing map.

::pull-graph{setups="${stock},${cams}"}
::

The cams gained ${fv('peak-power-gain', cams, stock)} at the peak. Idle vacuum changed by ${fv('idle-vacuum-change', cams, stock)}.

::results-table
::

::cautions
::

${INVENTED}`
    },
    moveNote: 'The top is thin: tell readers what the cam timing map did, add the cam card, and say what the idle vacuum change means for the brakes.',
  },
  {
    benchTestSlug: 'a-bigger-intercooler-on-a-3-0-l-turbo-diesel',
    end: 'approved',
    movedHoursAgo: 51,
    headline: 'A bigger intercooler on the 3.0 turbo diesel',
    deck: 'Colder charge air, the same calibration: what a larger bar-and-plate core gives a six-cylinder diesel.',
    tags: ['intercooler', 'diesel'],
    photos: [
      { hero: true, scene: { kind: 'bench', part: 'intercooler', count: 1, seed: 411 }, caption: 'The larger bar-and-plate core.', credit: CREDIT_STAFF, altText: 'A large intercooler core on a workbench.' },
    ],
    body: (c) => {
      const [stock, big] = c.s as [number, number]
      return `A diesel makes its power low and long, and charge air temperature is one of the first things its calibration reacts to. We swapped the factory intercooler for a larger bar-and-plate core and left the calibration alone.

::pull-graph{setups="${stock},${big}" channel="torque"}
::

The bigger core added ${fv('peak-torque-gain', big, stock)} of peak torque and ${fv('average-power-gain', big, stock)} of power on average.

::gain-graph{baseline=${stock} setups="${big}"}
::

::results-table
::

::spec-box
::

::cautions
::

${INVENTED}`
    },
  },
  {
    benchTestSlug: 'a-larger-throttle-body-on-a-3-5-l-v6',
    end: 'scheduled',
    movedHoursAgo: 22,
    headline: 'A 74 mm throttle body on the 3.5 V6',
    deck: 'On the V6 the factory throttle is a real restriction at the top of the rev range. A bigger one shows it.',
    tags: ['throttle-body', 'v6'],
    photos: [
      { hero: true, scene: { kind: 'bench', part: 'throttle-body', count: 1, seed: 421 }, caption: 'The 74 mm throttle body.', credit: CREDIT_STAFF, altText: 'A large round throttle body on a workbench.' },
    ],
    body: (c) => {
      const [stock, big] = c.s as [number, number]
      return `Unlike the inline six we tested earlier in the season, the 3.5 V6 breathes through a factory throttle that is small for it.

::pull-graph{setups="${stock},${big}"}
::

The 74 mm unit gained ${fv('peak-power-gain', big, stock)} at the peak, most of it above ${fv('largest-power-gain-rpm', big, stock)}.

::gain-graph{baseline=${stock} setups="${big}"}
::

::results-table
::

::spec-box
::

::cautions
::

${INVENTED}`
    },
  },
  {
    benchTestSlug: 'fuel-pressure-on-a-2-5-l-flat-four',
    end: 'draft',
    movedHoursAgo: 74,
    headline: 'Does fuel pressure matter on the 2.5 flat four?',
    deck: 'Base pressure 43 against 58 psi, pulse width trimmed to the same mixture. Draft.',
    tags: ['fuel', 'flat-four'],
    photos: [],
    body: (c) => {
      const [low, high] = c.s as [number, number]
      return `Notes so far: same mixture at both pressures, so any difference is atomisation.

::pull-graph{setups="${low},${high}"}
::

Gain at the peak ${fv('peak-power-gain', high, low)}; check against repeatability before writing it up.`
    },
  },
]
