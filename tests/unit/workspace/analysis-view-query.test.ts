// The analysis page's choices in the URL (issue 15 item 15): what a link carries is
// read back exactly, anything unknown or malformed is ignored, other parameters stay.
import { describe, expect, it } from 'vitest'
import { analysisViewQuery, hasAnalysisView, parseAnalysisView } from '../../../app/utils/analysisViewQuery'

describe('analysis view in the URL', () => {
  it('reads a shared link', () => {
    expect(parseAnalysisView({ setups: '12,14', baseline: '12', standard: 'din-70020', units: 'kw-nm' }))
      .toEqual({ setupIds: [12, 14], baselineId: 12, standard: 'din-70020', units: 'kw-nm' })
  })

  it('ignores what it does not know, so an edited or old link still opens', () => {
    expect(parseAnalysisView({ setups: '12,x', baseline: '-3', standard: 'metric-ish', units: 'furlongs' }))
      .toEqual({ setupIds: null, baselineId: null, standard: null, units: null })
    expect(parseAnalysisView({})).toEqual({ setupIds: null, baselineId: null, standard: null, units: null })
    expect(parseAnalysisView({ setups: ['7,7,8', '9'] }).setupIds).toEqual([7, 8])
  })

  it('writes a choice back, leaving defaults out and other parameters in', () => {
    const query = analysisViewQuery({ setupIds: null, baselineId: 4, standard: null, units: 'hp-lbft' }, { tab: 'x', setups: '1' })
    expect(query).toEqual({ tab: 'x', baseline: '4', units: 'hp-lbft' })
    expect(parseAnalysisView(query)).toEqual({ setupIds: null, baselineId: 4, standard: null, units: 'hp-lbft' })
  })

  it('round-trips every field', () => {
    const view = { setupIds: [3, 1], baselineId: 3, standard: 'std-60f' as const, units: 'kw-nm' as const }
    expect(parseAnalysisView(analysisViewQuery(view))).toEqual(view)
    expect(hasAnalysisView(analysisViewQuery(view))).toBe(true)
    expect(hasAnalysisView({ tab: 'x' })).toBe(false)
  })
})
