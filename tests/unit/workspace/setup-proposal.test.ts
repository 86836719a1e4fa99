import { describe, expect, it } from 'vitest'
import { proposeFromFileName, proposeSetups } from '#shared/utils/setup-proposal'

// Our own rule (issue 15 item 1): propose only when unambiguous, never default to the baseline.
const SETUPS = [
  { id: 11, label: 'Baseline: production hydraulic roller cam, stock manifolds', position: 1 },
  { id: 12, label: 'Long-tube headers, 1 3/4 in primaries', position: 2 },
  { id: 13, label: 'Headers plus ported intake', position: 3 },
]

describe('setup proposals', () => {
  it('proposes from a word only one setup has, or from the setup number in the name', () => {
    expect(proposeFromFileName('baseline-pull-2.csv', SETUPS)).toBe(11)
    expect(proposeFromFileName('PORTED_intake_run1.csv', SETUPS)).toBe(13)
    expect(proposeFromFileName('setup2_pull3.csv', SETUPS)).toBe(12)
    expect(proposeFromFileName('s3-1.csv', SETUPS)).toBe(13)
  })

  it('proposes nothing when the name fits two setups or none', () => {
    // "headers" is in two labels.
    expect(proposeFromFileName('headers-1.csv', SETUPS)).toBeNull()
    expect(proposeFromFileName('pull-0412.csv', SETUPS)).toBeNull()
  })

  it('never falls back to the baseline: files that say nothing get no setup', () => {
    expect(proposeSetups(['a.csv', 'b.csv'], SETUPS)).toEqual([{ setupId: null, source: null }, { setupId: null, source: null }])
  })

  it('uses the batch order only with one file per setup and no name that says anything', () => {
    expect(proposeSetups(['pull-3.csv', 'pull-1.csv', 'pull-10.csv'], SETUPS)).toEqual([
      { setupId: 12, source: 'batch-order' },
      { setupId: 11, source: 'batch-order' },
      { setupId: 13, source: 'batch-order' },
    ])
    expect(proposeSetups(['baseline-1.csv', 'x.csv', 'y.csv'], SETUPS)).toEqual([
      { setupId: 11, source: 'file-name' }, { setupId: null, source: null }, { setupId: null, source: null },
    ])
  })
})
