import { describe, expect, it } from 'vitest'
import * as math from 'mathjs'
import {
  HP_TORQUE_RPM, KPA_PER_INHG, KW_TORQUE_RPM, NM_PER_LBFT, W_PER_HP, W_PER_PS,
  cToF, fToC, fToK, hpToKw, hpToPs, inHgToKPa, kPaToInHg, kwToHp, kwToPs, lbFtToNm, nmToLbFt,
  powerHp, psToHp, psToKw, torqueLbFt, inHgToMbar, mbarToInHg,
} from '../../../shared/dyno/index'

// Relative closeness, for constants whose last digits differ by source.
const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b)

describe('unit constants (published: NIST SP 811, 2008, Appendix B)', () => {
  it('1 hp (550 ft-lbf/s) = 745.69987158227 W (published: NIST SP 811 B.8, 7.456999 E+02)', () => {
    expect(W_PER_HP).toBeCloseTo(745.69987158227, 9)
    expect(W_PER_HP.toPrecision(7)).toBe('745.6999')
  })
  it('1 PS (metric horsepower) = 735.49875 W (published: NIST SP 811 B.8, 7.354988 E+02)', () => {
    expect(W_PER_PS).toBeCloseTo(735.49875, 9)
  })
  it('1 lbf-ft = 1.3558179483314 N-m (published: NIST SP 811 B.8, 1.355818)', () => {
    expect(NM_PER_LBFT).toBeCloseTo(1.3558179483314, 12)
  })
  it('1 inHg (conventional, 0 C) = 3.386388640341 kPa (published: NIST SP 811 B.8, 3.386389 E+03 Pa)', () => {
    expect(KPA_PER_INHG).toBe(3.386388640341)
    // Check of the definition behind it: 13.5951 g/cm^3 x 9.80665 m/s^2 x 25.4 mm.
    expect(rel(KPA_PER_INHG, (13595.1 * 9.80665 * 0.0254) / 1000)).toBeLessThan(1e-12)
  })
  it('hp = lb-ft x rpm / 5252.1131 and kW = N-m x rpm / 9549.2966 (published: NIST SP 811; 33000 / 2 pi, 60000 / 2 pi)', () => {
    expect(HP_TORQUE_RPM).toBeCloseTo(5252.1131, 4)
    expect(KW_TORQUE_RPM).toBeCloseTo(9549.2966, 4)
    expect(powerHp(400, 5000)).toBeCloseTo((400 * 5000) / 5252.1131, 3)
    expect(torqueLbFt(400, 6000)).toBeCloseTo((400 * 5252.1131) / 6000, 3)
  })
})

describe('conversions cross-checked against mathjs units (general reference library)', () => {
  it('hp and kW: mathjs hp', () => {
    expect(rel(hpToKw(1), math.unit(1, 'hp').toNumber('kW'))).toBeLessThan(1e-9)
    expect(rel(kwToHp(300), math.unit(300, 'kW').toNumber('hp'))).toBeLessThan(1e-9)
  })
  it('PS: 75 kgf m/s in mathjs', () => {
    expect(rel(psToKw(1), math.unit(75, 'kgf m/s').toNumber('kW'))).toBeLessThan(1e-12)
    expect(rel(hpToPs(1), math.unit(1, 'hp').toNumber('W') / math.unit(75, 'kgf m/s').toNumber('W'))).toBeLessThan(1e-9)
  })
  it('lb-ft and N-m: mathjs lbf ft', () => {
    expect(rel(lbFtToNm(450), math.unit(450, 'lbf ft').toNumber('N m'))).toBeLessThan(1e-12)
    expect(rel(nmToLbFt(610), math.unit(610, 'N m').toNumber('lbf ft'))).toBeLessThan(1e-12)
  })
  it('inHg and kPa: mathjs has no inHg; 25.4 mmHg agrees to the rounding of its 133.322 Pa mmHg', () => {
    expect(rel(inHgToKPa(1), math.unit(25.4, 'mmHg').toNumber('kPa'))).toBeLessThan(5e-6)
  })
  it('F and C: mathjs degF, degC', () => {
    for (const f of [-40, 32, 60, 77, 78, 100]) expect(fToC(f)).toBeCloseTo(math.unit(f, 'degF').toNumber('degC'), 10)
    expect(fToK(60)).toBeCloseTo(math.unit(60, 'degF').toNumber('K'), 10)
  })
})

describe('conversions both ways return where they started', () => {
  it.each([0, 1, 487.5, 631.6])('%d', (v) => {
    expect(nmToLbFt(lbFtToNm(v))).toBeCloseTo(v, 10)
    expect(kwToHp(hpToKw(v))).toBeCloseTo(v, 10)
    expect(psToHp(hpToPs(v))).toBeCloseTo(v, 10)
    expect(kwToPs(psToKw(v))).toBeCloseTo(v, 10)
    expect(kPaToInHg(inHgToKPa(v))).toBeCloseTo(v, 10)
    expect(mbarToInHg(inHgToMbar(v))).toBeCloseTo(v, 10)
    expect(cToF(fToC(v))).toBeCloseTo(v, 10)
  })
  it('fixed points: -40 F = -40 C, 212 F = 100 C (published: definitions of the scales)', () => {
    expect(fToC(-40)).toBe(-40)
    expect(fToC(212)).toBeCloseTo(100, 12)
  })
  it('torque from power needs rpm above 0', () => {
    expect(() => torqueLbFt(100, 0)).toThrow(RangeError)
  })
})
