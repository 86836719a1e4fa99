import { describe, expect, it } from 'vitest'
import * as math from 'mathjs'
import {
  G_PER_KWH_PER_LB_PER_HPH, bmepPsi, bsfcLbPerHpH, ciToLiters, displacementCi, litersToCi,
  pistonSpeedFtMin, theoreticalCfm, volumetricEfficiencyPct,
} from '../../../shared/dyno/index'

// Textbook forms (published: Heywood, Internal Combustion Engine Fundamentals, ch. 2).
describe('engine figures', () => {
  it('displacement: 4.00 in bore x 3.48 in stroke x 8 = 349.85 in^3 (published: pi/4 x B^2 x S x n)', () => {
    const ci = displacementCi({ boreIn: 4, strokeIn: 3.48, cylinders: 8 })
    expect(ci).toBeCloseTo(349.85, 2)
    // mathjs in^3 -> L cross-check of the litre conversion (general reference library)
    expect(ciToLiters(ci)).toBeCloseTo(math.unit(ci, 'in^3').toNumber('L'), 10)
    expect(litersToCi(ciToLiters(ci))).toBeCloseTo(ci, 10)
  })

  it('BMEP = 4 pi T / Vd = 150.80 x lb-ft / in^3 (published); 400 lb-ft from 350 in^3 = 172.34 psi', () => {
    expect(bmepPsi(1, 1)).toBeCloseTo(150.8, 2)
    expect(bmepPsi(400, 350)).toBeCloseTo((150.796 * 400) / 350, 2)
    expect(bmepPsi(400, 350)).toBeCloseTo(172.34, 2)
    // Same in SI via mathjs: 4 pi x 400 lbf ft / 350 in^3, in psi.
    const si = math.unit(4 * Math.PI * 400, 'lbf ft').toNumber('N m') / math.unit(350, 'in^3').toNumber('m^3')
    expect(bmepPsi(400, 350)).toBeCloseTo(math.unit(si, 'Pa').toNumber('psi'), 6)
  })

  it('theoretical airflow = in^3 x rpm / 3456 (published, 4-stroke): 350 in^3 at 6000 rpm = 607.64 cfm', () => {
    expect(theoreticalCfm(350, 6000)).toBeCloseTo(607.64, 2)
    // cross-check: half the displacement per revolution, in ft^3/min, via mathjs
    expect(theoreticalCfm(350, 6000)).toBeCloseTo(math.unit((350 * 6000) / 2, 'in^3').toNumber('ft^3'), 9)
    expect(volumetricEfficiencyPct(500, 350, 6000)).toBeCloseTo((500 / 607.6389) * 100, 3)
  })

  it('mean piston speed = stroke x rpm / 6 (published): 3.48 in at 6000 rpm = 3480 ft/min', () => {
    expect(pistonSpeedFtMin(3.48, 6000)).toBeCloseTo(3480, 9)
  })

  it('BSFC = fuel flow / power; 1 lb/hp-h = 608.28 g/kWh (published: check-sources; NIST SP 811 lb and hp)', () => {
    expect(bsfcLbPerHpH(250, 500)).toBe(0.5)
    expect(G_PER_KWH_PER_LB_PER_HPH).toBeCloseTo(608.28, 2)
    expect(G_PER_KWH_PER_LB_PER_HPH).toBeCloseTo(math.unit(1, 'lb').toNumber('g') / math.unit(1, 'hp').toNumber('kW'), 6)
  })

  it('refuses impossible engine dimensions', () => {
    expect(() => displacementCi({ boreIn: 0, strokeIn: 3.48, cylinders: 8 })).toThrow(RangeError)
    expect(() => displacementCi({ boreIn: 4, strokeIn: 3.48, cylinders: 7.5 })).toThrow(/cylinders/)
    expect(() => bmepPsi(400, 0)).toThrow(RangeError)
  })
})
