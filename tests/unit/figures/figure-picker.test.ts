// The figure picker's starting points (issue 15 item 4): each kind of figure starts from
// its own defaults, never from the previous figure's choices. Desk practice, not a
// computation: a results table lists the baseline its gains are measured from.
import { describe, expect, it } from 'vitest'
import { pickerDefaults, resultsTableSetups, type PickerContext } from '#shared/utils/figure-picker'
import { blockFigureSnippet } from '#shared/utils/figure-snippets'

// Bench order as the workspace keeps it: the baseline need not come first.
const ctx: PickerContext = {
  setups: [{ id: 12, isBaseline: false }, { id: 11, isBaseline: true }, { id: 13, isBaseline: false }],
  camSetupIds: [11, 13],
  photoIds: [7, 8],
}

describe('figure picker defaults', () => {
  it('a results table starts with the baseline and every setup, no caption, gains over the bench test\'s baseline', () => {
    const d = pickerDefaults('results-table', ctx)
    expect(d).toMatchObject({ setups: [11, 12, 13], caption: '', baseline: '' })
    expect(blockFigureSnippet('results-table', { setups: d.setups, baseline: undefined, caption: undefined }).text)
      .toBe('::results-table{setups="11,12,13"}\n::')
  })

  it('a pull graph shows every setup with the baseline first, both channels, the whole rpm range', () => {
    expect(pickerDefaults('pull-graph', ctx)).toMatchObject({ setups: [11, 12, 13], channel: 'both', from: '', to: '', caption: '' })
  })

  it('a gain graph starts with the setups measured against the baseline', () => {
    expect(pickerDefaults('gain-graph', ctx).setups).toEqual([12, 13])
  })

  it('the same kind twice starts clean each time: defaults do not depend on what was chosen before', () => {
    const first = pickerDefaults('pull-graph', ctx)
    first.setups.splice(0, 1)
    first.caption = 'The cam alone'
    expect(pickerDefaults('pull-graph', ctx)).toMatchObject({ setups: [11, 12, 13], caption: '' })
  })

  it('a cam card starts on the cam under test, a value on the first changed setup, a gallery with every photo', () => {
    expect(pickerDefaults('cam-card', ctx).camSetup).toBe(13)
    expect(pickerDefaults('cam-card', { ...ctx, camSetupIds: [11] }).camSetup).toBe(11)
    expect(pickerDefaults('value', ctx)).toMatchObject({ valueKey: 'peak-power-gain', valueSetup: 12, valueVs: '' })
    expect(pickerDefaults('gallery', ctx).photoIds).toEqual([7, 8])
    expect(pickerDefaults('photo', ctx)).toMatchObject({ photoId: 7, photoSize: 'wide', photoIds: [] })
  })

  it('an empty bench test gives empty choices, not errors', () => {
    expect(pickerDefaults('results-table', { setups: [], camSetupIds: [], photoIds: [] })).toMatchObject({ setups: [], camSetup: '', photoId: '', valueSetup: '' })
  })
})

describe('a results table keeps the setup its gains are measured from', () => {
  it('puts it first when it was left out, keeps the choice otherwise', () => {
    expect(resultsTableSetups([12, 13], 11)).toEqual([11, 12, 13])
    expect(resultsTableSetups([13, 11], 11)).toEqual([13, 11])
    expect(resultsTableSetups([], 11)).toEqual([])
    expect(resultsTableSetups([12], null)).toEqual([12])
  })
})
