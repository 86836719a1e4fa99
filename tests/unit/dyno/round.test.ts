import { describe, expect, it } from 'vitest'
import { reportFixed, reportRound } from '../../../shared/dyno/index'

describe('reportRound: nearest, ties away from zero (common practice), exact on decimal ties', () => {
  it('a peak of 487.5 hp is reported as 488 hp, and -487.5 as -488 (common practice)', () => {
    expect(reportRound(487.5)).toBe(488)
    expect(reportRound(-487.5)).toBe(-488)
  })
  it('a peak of 631.6 hp is reported as 632 (common practice)', () => {
    expect(reportRound(631.6)).toBe(632)
  })
  it('decimal ties that binary floating point stores just below the tie still round up', () => {
    // 1.005, 2.675, 8.345 and 1.45 are all stored slightly below their decimal value.
    expect(Math.round(1.005 * 100) / 100).toBe(1) // the naive way gets it wrong
    expect(reportRound(1.005, 2)).toBe(1.01)
    expect(reportRound(2.675, 2)).toBe(2.68)
    expect(reportRound(8.345, 2)).toBe(8.35)
    expect(reportRound(1.45, 1)).toBe(1.5)
    expect(reportRound(-1.005, 2)).toBe(-1.01)
  })
  it('differences are rounded from the unrounded values at their decimal tie (issue 15 item 8)', () => {
    // An idle vacuum of 19.15 inHg (shown 19.2) falling to 16.0: the change is -3.15, reported -3.2
    // (common practice: ties away from zero). In doubles it is -3.1499999999999986.
    expect(16.0 - 19.15).toBeGreaterThan(-3.15)
    expect(reportRound(16.0 - 19.15, 1)).toBe(-3.2)
    expect(reportFixed(19.15 - 16.0, 1)).toBe('3.2')
    // Near-equal operands make the noise larger than the difference's own last digit.
    expect(500.25 - 500.1).toBeLessThan(0.15)
    expect(reportRound(500.25 - 500.1, 1)).toBe(0.2)
    expect(reportRound(512.35 - 487.5, 1)).toBe(24.9)
    // Real non-ties far from the snap are untouched.
    expect(reportRound(3.1449, 2)).toBe(3.14)
    expect(reportRound(-3.1449, 1)).toBe(-3.1)
  })
  it('non-ties go to the nearest', () => {
    expect(reportRound(2.4999)).toBe(2)
    expect(reportRound(2.5001)).toBe(3)
    expect(reportRound(0.5)).toBe(1)
    expect(reportRound(-0.5)).toBe(-1)
    expect(reportRound(99.95, 1)).toBe(100)
    expect(reportRound(123.456, 1)).toBe(123.5)
  })
  it('small, large and zero values', () => {
    expect(Object.is(reportRound(-0.4), 0)).toBe(true) // no "-0" in a table
    expect(reportRound(0.0005, 3)).toBe(0.001)
    expect(reportRound(1e-7, 3)).toBe(0)
    expect(reportRound(1.5e21)).toBe(1.5e21)
    expect(reportRound(12, 2)).toBe(12)
  })
  it('reportFixed keeps the trailing zero: 2.0 percent', () => {
    expect(reportFixed((12 / 598) * 100, 1)).toBe('2.0')
    expect(reportFixed(99.95, 1)).toBe('100.0')
  })
  it('refuses a bad number of decimals', () => {
    expect(() => reportRound(1, -1)).toThrow(RangeError)
    expect(() => reportRound(1, 1.5)).toThrow(RangeError)
  })
})
