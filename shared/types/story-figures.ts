// Figures a story places in its Markdown body with MDC syntax, under names of our
// own. Block figures stand on a line of their own and close with `::`:
//
//   ::pull-graph{setups="12,13" channel="power" from=2500 to=6500}
//   ::
//
// The inline value sits in a sentence: `the cam gained :figure-value{of="peak-power-gain" setup=13 vs=12}`.
// (Not `:figure`, which the renderer would confuse with the HTML <figure> element.)
// Setup and photo ids are the database ids of the story's bench test; they stay
// put when setups are reordered. MDC hands every value over as written, so the
// options accept "12" as well as 12.
//
// The options are read by the small readers below, not by zod: every figure
// component checks its options in the reader's browser, and zod would be the
// largest part of a story page's JavaScript. A check answers in the shape of a
// zod safeParse, so the server's, the editor's and the figures' issue lists read
// both alike. The values themselves are computed in shared/stories/figure-values.ts.
import type { AnalysisGains, AnalysisResponse } from './analysis-results'

// ---------- reading options ----------

/** One problem with a figure's options; path [] is about the options as a whole. */
export interface FigureOptionIssue { path: (string | number)[], message: string }

export type FigureOptionsResult<T>
  = { success: true, data: T, error?: never } | { success: false, data?: never, error: { issues: FigureOptionIssue[] } }

export interface FigureOptionsSchema<T> {
  /** The option names the figure takes; any other is refused. */
  readonly names: readonly string[]
  safeParse(input: unknown): FigureOptionsResult<T>
}

/** How one option is read: its value, or what is wrong with it. */
type OptionReader<T> = (written: unknown) => { value: T } | { problem: string }

/** Options from one reader per name, then a check of them together (only when each is right). */
function figureOptions<T extends object>(
  readers: { [K in keyof T]-?: OptionReader<T[K]> },
  together?: (options: T) => FigureOptionIssue | null,
): FigureOptionsSchema<T> {
  const names = Object.keys(readers)
  return {
    names,
    safeParse(input) {
      if (!input || typeof input !== 'object' || Array.isArray(input)) {
        return { success: false, error: { issues: [{ path: [], message: 'Give the options as name=value pairs' }] } }
      }
      const written = input as Record<string, unknown>
      const issues: FigureOptionIssue[] = []
      const data: Record<string, unknown> = {}
      for (const name of names) {
        const read = (readers as Record<string, OptionReader<unknown>>)[name]!(written[name])
        if ('problem' in read) issues.push({ path: [name], message: read.problem })
        else if (read.value !== undefined) data[name] = read.value
      }
      for (const name of Object.keys(written)) {
        if (!names.includes(name)) issues.push({ path: [], message: `"${name}" is not an option of this figure` })
      }
      const issue = !issues.length && together ? together(data as T) : null
      if (issue) issues.push(issue)
      return issues.length ? { success: false, error: { issues } } : { success: true, data: data as T }
    },
  }
}

const optional = <T>(read: OptionReader<T>): OptionReader<T | undefined> =>
  written => (written === undefined ? { value: undefined } : read(written))

const withDefault = <T>(read: OptionReader<T>, fallback: T): OptionReader<T> =>
  written => (written === undefined ? { value: fallback } : read(written))

interface WholeNumberRule { notANumber: string, notWhole: string, min: number, belowMin: string, max?: number, aboveMax?: string }

/** A whole number as Number() reads what was written ("12", 12, " 12 "). */
function wholeNumber(rule: WholeNumberRule): OptionReader<number> {
  return (written) => {
    const n = Number(written)
    if (!Number.isFinite(n)) return { problem: rule.notANumber }
    if (!Number.isSafeInteger(n)) return { problem: rule.notWhole }
    if (n < rule.min) return { problem: rule.belowMin }
    if (rule.max !== undefined && n > rule.max) return { problem: rule.aboveMax ?? rule.belowMin }
    return { value: n }
  }
}

function oneOf<T extends string>(ids: readonly T[], problem: string): OptionReader<T> {
  return written => (ids.includes(written as T) ? { value: written as T } : { problem })
}

const ID_LIST = /^\s*\d+(\s*,\s*\d+)*\s*$/

const IdOption = wholeNumber({ notANumber: 'Use a number id', notWhole: 'Use a whole-number id', min: 1, belowMin: 'Use an id above 0' })

/** "12,13" (or a list of ids), each id once, from 1 to 24 of them. */
const IdListOption: OptionReader<number[]> = (written) => {
  let ids: number[]
  if (typeof written === 'string' && ID_LIST.test(written)) ids = written.split(',').map(Number)
  else if (Array.isArray(written)) {
    const read = written.map(IdOption)
    const bad = read.find(r => 'problem' in r)
    if (bad) return bad
    ids = read.map(r => (r as { value: number }).value)
  }
  else return { problem: 'Use ids separated by commas, like "12,13"' }
  const once = [...new Set(ids)]
  return once.length >= 1 && once.length <= 24 ? { value: once } : { problem: 'Name from 1 to 24 ids' }
}

const RpmOption = wholeNumber({
  notANumber: 'Use an rpm as a number', notWhole: 'Use a whole rpm',
  min: 0, belowMin: 'Use an rpm of 0 or more', max: 20_000, aboveMax: 'Above 20,000 rpm is not plausible',
})

const CaptionOption: OptionReader<string> = (written) => {
  if (typeof written !== 'string') return { problem: 'Write the caption as text' }
  return written.length > 500 ? { problem: 'Keep the caption under 500 characters' } : { value: written }
}

const quotedList = (ids: readonly string[]) => ids.map(id => `"${id}"`).join(', ')

export const GRAPH_CHANNELS = [
  { id: 'both', label: 'Power and torque' },
  { id: 'power', label: 'Power' },
  { id: 'torque', label: 'Torque' },
] as const
export type GraphChannel = typeof GRAPH_CHANNELS[number]['id']
const GRAPH_CHANNEL_IDS = GRAPH_CHANNELS.map(c => c.id)
const ChannelOption = withDefault(oneOf(GRAPH_CHANNEL_IDS, `Use one of ${quotedList(GRAPH_CHANNEL_IDS)}`), 'both')

const rpmInOrder = (o: { from?: number, to?: number }): FigureOptionIssue | null =>
  o.from === undefined || o.to === undefined || o.from < o.to ? null : { path: ['to'], message: '"from" is below "to"' }

export interface PullGraphOptions { setups?: number[], channel: GraphChannel, from?: number, to?: number, caption?: string }

const GRAPH_OPTIONS = {
  setups: optional(IdListOption),
  channel: ChannelOption,
  from: optional(RpmOption),
  to: optional(RpmOption),
  caption: optional(CaptionOption),
}

/** Overlay of setups' curves against rpm. Without setups: every analysed setup. */
export const PullGraphProps = figureOptions<PullGraphOptions>(GRAPH_OPTIONS, rpmInOrder)

export interface GainGraphOptions extends PullGraphOptions { baseline?: number }

/** Gain curves (setup minus baseline at each rpm). Without baseline: the bench test's. */
export const GainGraphProps = figureOptions<GainGraphOptions>({ baseline: optional(IdOption), ...GRAPH_OPTIONS }, rpmInOrder)

/** The results table: peaks, averages, gains, power band, idle vacuum. */
export const ResultsTableProps = figureOptions<{ setups?: number[], baseline?: number, caption?: string }>({
  setups: optional(IdListOption),
  baseline: optional(IdOption),
  caption: optional(CaptionOption),
})

/** The build sheet of the bench test's engine. */
export const SpecBoxProps = figureOptions<{ caption?: string }>({ caption: optional(CaptionOption) })

/** A setup's cam card (durations, lifts, LSA, ICL and the events computed from them). */
export const CamCardProps = figureOptions<{ setup: number, caption?: string }>({ setup: IdOption, caption: optional(CaptionOption) })

export const PHOTO_SIZES = [{ id: 'wide', label: 'Full width' }, { id: 'inline', label: 'In the text column' }] as const
export type PhotoSize = typeof PHOTO_SIZES[number]['id']
const PHOTO_SIZE_IDS = PHOTO_SIZES.map(s => s.id)

/** One photo of the bench test with its caption and credit. */
export const PhotoProps = figureOptions<{ id: number, size: PhotoSize }>({
  id: IdOption,
  size: withDefault(oneOf(PHOTO_SIZE_IDS, `Use one of ${quotedList(PHOTO_SIZE_IDS)}`), 'wide'),
})

/** Several photos in a row or grid. */
export const GalleryProps = figureOptions<{ ids: number[], caption?: string }>({ ids: IdListOption, caption: optional(CaptionOption) })

export const DAY_REPORT_SHOWS = [
  { id: 'both', label: 'The sentences and the table' },
  { id: 'summary', label: 'The sentences only' },
  { id: 'table', label: 'The table only' },
] as const
export type DayReportShow = typeof DAY_REPORT_SHOWS[number]['id']
const DAY_REPORT_SHOW_IDS = DAY_REPORT_SHOWS.map(s => s.id)

/**
 * The bench test's test plan against what happened on the day (pulls made, setups
 * skipped, time per swap), as the day view reports it; frozen with the story's data.
 */
export const DayReportProps = figureOptions<{ show: DayReportShow, caption?: string }>({
  show: withDefault(oneOf(DAY_REPORT_SHOW_IDS, `Use one of ${quotedList(DAY_REPORT_SHOW_IDS)}`), 'both'),
  caption: optional(CaptionOption),
})

/** The usual cautions (brief: "Cautions"); the text is the site's own, not the writer's. */
export const CautionsProps = figureOptions<Record<never, never>>({})

export const BLOCK_FIGURES = [
  { name: 'pull-graph', label: 'Pull graph', schema: PullGraphProps, example: '::pull-graph{setups="1,2" channel="power"}' },
  { name: 'gain-graph', label: 'Gain graph', schema: GainGraphProps, example: '::gain-graph{baseline=1 setups="2"}' },
  { name: 'results-table', label: 'Results table', schema: ResultsTableProps, example: '::results-table' },
  { name: 'spec-box', label: 'Build sheet box', schema: SpecBoxProps, example: '::spec-box' },
  { name: 'cam-card', label: 'Cam card', schema: CamCardProps, example: '::cam-card{setup=2}' },
  { name: 'photo', label: 'Photo', schema: PhotoProps, example: '::photo{id=12}' },
  { name: 'gallery', label: 'Gallery', schema: GalleryProps, example: '::gallery{ids="12,13"}' },
  { name: 'cautions', label: 'Cautions', schema: CautionsProps, example: '::cautions' },
  { name: 'day-report', label: 'The test day: plan against what happened', schema: DayReportProps, example: '::day-report' },
] as const
export type BlockFigureName = typeof BLOCK_FIGURES[number]['name']

export const INLINE_FIGURE_NAME = 'figure-value'

// ---------- inline values ----------

export type FigureUnit = 'hp' | 'lb-ft' | 'rpm' | 'inHg' | '%'

/**
 * Everything an inline value may name. `pair` figures compare `setup` with `vs`
 * (default: the bench test's baseline); the others describe one setup.
 */
export const INLINE_FIGURES = [
  { id: 'peak-power', label: 'Peak power', unit: 'hp', pair: false },
  { id: 'peak-power-rpm', label: 'Rpm of peak power', unit: 'rpm', pair: false },
  { id: 'peak-torque', label: 'Peak torque', unit: 'lb-ft', pair: false },
  { id: 'peak-torque-rpm', label: 'Rpm of peak torque', unit: 'rpm', pair: false },
  { id: 'average-power', label: 'Average power over the shared band', unit: 'hp', pair: false },
  { id: 'average-torque', label: 'Average torque over the shared band', unit: 'lb-ft', pair: false },
  { id: 'power-band', label: 'Power band (from-to)', unit: 'rpm', pair: false },
  { id: 'power-band-width', label: 'Width of the power band', unit: 'rpm', pair: false },
  { id: 'idle-vacuum', label: 'Idle vacuum', unit: 'inHg', pair: false },
  { id: 'peak-power-gain', label: 'Peak-to-peak power gain', unit: 'hp', pair: true },
  { id: 'peak-power-gain-pct', label: 'Peak-to-peak power gain, percent', unit: '%', pair: true },
  { id: 'peak-torque-gain', label: 'Peak-to-peak torque gain', unit: 'lb-ft', pair: true },
  { id: 'peak-torque-gain-pct', label: 'Peak-to-peak torque gain, percent', unit: '%', pair: true },
  { id: 'average-power-gain', label: 'Average power gain', unit: 'hp', pair: true },
  { id: 'average-power-gain-pct', label: 'Average power gain, percent', unit: '%', pair: true },
  { id: 'average-torque-gain', label: 'Average torque gain', unit: 'lb-ft', pair: true },
  { id: 'average-torque-gain-pct', label: 'Average torque gain, percent', unit: '%', pair: true },
  { id: 'largest-power-gain', label: 'Largest power gain at one rpm', unit: 'hp', pair: true },
  { id: 'largest-power-gain-rpm', label: 'Rpm of the largest power gain', unit: 'rpm', pair: true },
  { id: 'largest-torque-gain', label: 'Largest torque gain at one rpm', unit: 'lb-ft', pair: true },
  { id: 'largest-torque-gain-rpm', label: 'Rpm of the largest torque gain', unit: 'rpm', pair: true },
  { id: 'largest-power-loss', label: 'Largest power loss at one rpm', unit: 'hp', pair: true },
  { id: 'largest-torque-loss', label: 'Largest torque loss at one rpm', unit: 'lb-ft', pair: true },
  { id: 'torque-crossover-rpm', label: 'Torque crossover rpm', unit: 'rpm', pair: true },
  { id: 'power-crossover-rpm', label: 'Power crossover rpm', unit: 'rpm', pair: true },
  { id: 'idle-vacuum-change', label: 'Change of idle vacuum', unit: 'inHg', pair: true },
] as const satisfies readonly { id: string, label: string, unit: FigureUnit, pair: boolean }[]
export type InlineFigureKey = typeof INLINE_FIGURES[number]['id']

export interface FigureValueOptions { of: InlineFigureKey, setup: number, vs?: number, decimals?: number }
const DECIMALS = 'Use 0, 1 or 2 decimals'

/** `:figure-value{of="peak-power-gain" setup=13 vs=12}`; decimals overrides the reporting default. */
export const FigureValueProps = figureOptions<FigureValueOptions>({
  of: oneOf(INLINE_FIGURES.map(f => f.id), 'Choose a figure the data gives'),
  setup: IdOption,
  vs: optional(IdOption),
  decimals: optional(wholeNumber({ notANumber: DECIMALS, notWhole: DECIMALS, min: 0, belowMin: DECIMALS, max: 2 })),
})

/** Reporting precision (brief: peaks to the unit shown; one decimal where it matters). */
export const DEFAULT_DECIMALS: Record<FigureUnit, number> = { 'hp': 0, 'lb-ft': 0, 'rpm': 0, 'inHg': 1, '%': 1 }

/** Gains of one ordered pair of setups (setup minus vs), from the full corrected curves. */
export interface FigureComparison { setupId: number, vsSetupId: number, gains: AnalysisGains }

/** What the figures are computed from: the analysis (hp and lb-ft) and every pair's gains. */
export interface FigureSource {
  analysis: Pick<AnalysisResponse, 'baselineSetupId' | 'table' | 'units'> & { setups: { setupId: number, label: string }[] }
  comparisons: readonly FigureComparison[]
}

export interface InlineFigureValue {
  /** As the reader sees it: "488 hp", "6,200 rpm", "4.2%", "within repeatability". */
  text: string
  /** After reporting rounding; null when there is no such figure (no crossover ...). */
  value: number | null
  unit: FigureUnit
  /** "Peak-to-peak power gain, Long-duration cam vs Baseline". */
  label: string
  /** True when the gain is no bigger than the spread of repeat pulls (shown as such, not as a gain). */
  withinRepeatability: boolean | null
  /** Why the value cannot be given (unknown setup ...); text is then "[no such figure]". */
  problem: string | null
}
