// Where the editor's figure picker starts for each kind of figure. Each figure starts
// fresh from what that kind usually shows (issue 15 item 4: a results table inserted
// after a pull graph came with the graph's caption and without the baseline): graphs
// and tables every analysed setup with the baseline first, a gain graph the setups
// measured against the baseline, a cam card the camshaft under test. Nothing typed
// for one figure carries over to the next.
import type { BlockFigureName, DayReportShow, InlineFigureKey } from '../types/story-figures'

export type PickerKind = BlockFigureName | 'value'

export interface PickerSetup { id: number, isBaseline: boolean }

export interface PickerContext {
  /** The analysed setups of the bench test, in its order. */
  setups: readonly PickerSetup[]
  /** Setups with a camshaft card, in the bench test's order. */
  camSetupIds: readonly number[]
  photoIds: readonly number[]
}

export interface PickerState {
  setups: number[]
  channel: 'both' | 'power' | 'torque'
  from: number | ''
  to: number | ''
  caption: string
  /** '' is the bench test's own baseline. */
  baseline: number | ''
  camSetup: number | ''
  photoId: number | ''
  photoSize: 'wide' | 'inline'
  photoIds: number[]
  valueKey: InlineFigureKey
  valueSetup: number | ''
  valueVs: number | ''
  dayShow: DayReportShow
}

const baselineFirst = (setups: readonly PickerSetup[]): number[] =>
  [...setups.filter(s => s.isBaseline), ...setups.filter(s => !s.isBaseline)].map(s => s.id)

export function pickerDefaults(kind: PickerKind, ctx: PickerContext): PickerState {
  const changed = ctx.setups.filter(s => !s.isBaseline)
  const baselineIds = new Set(ctx.setups.filter(s => s.isBaseline).map(s => s.id))
  // The cam under test rather than the stock one, when the baseline has a card too.
  const camSetup = ctx.camSetupIds.find(id => !baselineIds.has(id)) ?? ctx.camSetupIds[0] ?? ''
  return {
    setups: kind === 'gain-graph' ? changed.map(s => s.id) : kind === 'pull-graph' || kind === 'results-table' ? baselineFirst(ctx.setups) : [],
    channel: 'both',
    from: '',
    to: '',
    caption: '',
    baseline: '',
    camSetup,
    photoId: ctx.photoIds[0] ?? '',
    photoSize: 'wide',
    photoIds: kind === 'gallery' ? [...ctx.photoIds] : [],
    valueKey: 'peak-power-gain',
    valueSetup: changed[0]?.id ?? ctx.setups[0]?.id ?? '',
    valueVs: '',
    dayShow: 'both',
  }
}

/**
 * The setups a results table lists: those chosen, and always the setup its gains are
 * measured from (first, when it was left out), so every gain has its reference row.
 * None chosen means every setup, which includes it already.
 */
export function resultsTableSetups(chosen: readonly number[], gainsFrom: number | null): number[] {
  if (!chosen.length || gainsFrom === null || chosen.includes(gainsFrom)) return [...chosen]
  return [gainsFrom, ...chosen]
}
