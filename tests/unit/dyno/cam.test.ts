import { describe, expect, it } from 'vitest'
import { camEvents } from '../../../shared/dyno/index'

// Cam card arithmetic from the definitions (published: check-sources.md, cam card definitions).
describe('cam events', () => {
  it('224/230 at 0.050 on a 112 LSA, installed at 108 ICL (worked by hand)', () => {
    // ECL = 2 x 112 - 108 = 116; advance = 112 - 108 = 4
    // IVO = 224/2 - 108 = 4 BTDC; IVC = 112 + 108 - 180 = 40 ABDC
    // EVO = 230/2 + 116 - 180 = 51 BBDC; EVC = 115 - 116 = -1 ATDC (closes 1 deg before TDC)
    // overlap = 4 + (-1) = 3 = (224 + 230)/2 - 2 x 112
    expect(camEvents({ intakeDuration: 224, exhaustDuration: 230, lsa: 112, icl: 108 })).toEqual({
      ecl: 116, ivo: 4, ivc: 40, evo: 51, evc: -1, overlap: 3, advance: 4,
    })
  })

  it('a cam installed straight up (ICL = LSA) has no advance and equal centerlines', () => {
    const e = camEvents({ intakeDuration: 250, exhaustDuration: 250, lsa: 108, icl: 108 })
    expect(e.advance).toBe(0)
    expect(e.ecl).toBe(108)
    expect(e.ivo).toBe(e.evc) // symmetric about TDC
    expect(e.overlap).toBe(250 - 216)
  })

  it('identities hold for a range of cards: IVO + 180 + IVC = Di, EVO + 180 + EVC = De, overlap = (Di + De)/2 - 2 LSA', () => {
    for (const di of [204, 218.5, 236, 260]) {
      for (const de of [210, 224, 248]) {
        for (const lsa of [106, 110, 114]) {
          for (const icl of [102, 106, 110]) {
            const e = camEvents({ intakeDuration: di, exhaustDuration: de, lsa, icl })
            expect(e.ivo + 180 + e.ivc).toBeCloseTo(di, 10)
            expect(e.evo + 180 + e.evc).toBeCloseTo(de, 10)
            expect(e.overlap).toBeCloseTo((di + de) / 2 - 2 * lsa, 10)
            expect(e.ecl + icl).toBeCloseTo(2 * lsa, 10)
          }
        }
      }
    }
  })

  it('advancing the cam opens the intake earlier and closes it earlier by the same amount', () => {
    const straight = camEvents({ intakeDuration: 230, exhaustDuration: 236, lsa: 110, icl: 110 })
    const advanced = camEvents({ intakeDuration: 230, exhaustDuration: 236, lsa: 110, icl: 106 })
    expect(advanced.ivo - straight.ivo).toBe(4)
    expect(advanced.ivc - straight.ivc).toBe(-4)
    expect(advanced.overlap).toBe(straight.overlap) // overlap depends on durations and LSA only
  })

  it('rejects impossible cards', () => {
    expect(() => camEvents({ intakeDuration: 0, exhaustDuration: 230, lsa: 110, icl: 106 })).toThrow(RangeError)
    expect(() => camEvents({ intakeDuration: 230, exhaustDuration: 230, lsa: 110, icl: Number.NaN })).toThrow(/centerline/)
  })
})
