import { describe, expect, it } from 'vitest'
import { DISAGREEMENT_CODE, groupRepeatedProblems, median, parsePullCsv, powerHp, type Problem } from '../../../shared/dyno/index'

// A smooth pull whose power column was corrected (x 1.04, as an SAE-style factor would) and
// whose torque column was not: hp = lb-ft x rpm / 5252.113 (NIST SP 811) no longer holds on
// any line, by 4 % everywhere.
const torqueAt = (rpm: number): number => 400 + 0.02 * (rpm - 2500) - 4e-6 * (rpm - 2500) ** 2
function correctedPowerFile(factor = 1.04): string {
  const lines = ['RPM,Torque (lb-ft),Power (hp)']
  for (let r = 2500; r <= 6000; r += 50) lines.push(`${r},${torqueAt(r).toFixed(2)},${(powerHp(torqueAt(r), r) * factor).toFixed(2)}`)
  return lines.join('\n') + '\n'
}

describe('repeated warnings, said once', () => {
  it('one summary per file for torque and power disagreeing on every line: range and typical difference', () => {
    const problems = parsePullCsv(correctedPowerFile()).problems
    expect(problems).toHaveLength(1)
    const [only] = problems
    expect(only).toMatchObject({ severity: 'warning', line: 2, code: DISAGREEMENT_CODE, group: { count: 71, firstLine: 2, lastLine: 72, fromRpm: 2500, toRpm: 6000 } })
    expect(only!.group!.typicalValue).toBeCloseTo(4, 1)
    expect(only!.message).toBe('torque and power disagree on 71 lines (lines 2-72, 2500-6000 rpm), typically by 4.0 %: one column was probably corrected (to a weather standard, say) and the other not')
    // The lines themselves, on demand.
    expect(only!.detail).toHaveLength(71)
    expect(only!.detail![0]!.message).toMatch(/disagree by 4\.0 % at 2500 rpm/)
  })

  it('keeps two lines of a kind as they are, and never groups errors', () => {
    const two: Problem[] = [
      { severity: 'warning', line: 5, message: 'gap of 700 rpm between 3900 and 4600 rpm' },
      { severity: 'warning', line: 9, message: 'gap of 600 rpm between 5000 and 5600 rpm' },
    ]
    expect(groupRepeatedProblems(two)).toEqual(two)
    const errors: Problem[] = [3, 4, 5, 6].map(line => ({ severity: 'error', line, column: 'Torque', message: `"x${line}" in column "Torque" is not a number` }))
    expect(groupRepeatedProblems(errors)).toEqual(errors)
  })

  it('groups any warning repeated on many lines by its wording without figures, in the first one\'s place', () => {
    const spikes: Problem[] = [10, 20, 30].map(line => ({ severity: 'warning', line, message: `spike at ${line * 100} rpm: torque 450.0 lb-ft against about 400.${line} either side` }))
    const list: Problem[] = [{ severity: 'warning', line: 4, message: 'something else' }, ...spikes, { severity: 'error', message: 'only 5 usable rows' }]
    const out = groupRepeatedProblems(list)
    expect(out.map(p => p.message)).toEqual([
      'something else',
      'the same on 3 lines (lines 10-30), the first: spike at 1000 rpm: torque 450.0 lb-ft against about 400.10 either side',
      'only 5 usable rows',
    ])
    expect(out[1]!.detail).toEqual(spikes)
  })

  it('takes the median as the typical value', () => {
    // Median definition as in any statistics textbook: the middle of the sorted values.
    expect(median([3, 1, 2])).toBe(2)
    expect(median([4, 1, 3, 2])).toBe(2.5)
  })
})
