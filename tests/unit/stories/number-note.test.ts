// The number check as writers and editors read it (issue 15 item 5): the sentence
// quoted instead of a line number of the Markdown, numbers grouped as the page prints
// them, and each finding placed beside the paragraph that holds it. Presentation only;
// the figures come from the check itself (number-check.test.ts).
import { describe, expect, it } from 'vitest'
import { countNumber, findingNote, findingQuote, findingsInBlock, placeFindings } from '#shared/utils/number-note'
import type { NumberFinding } from '#shared/types/stories'

const body = [
  '## The long cam on the dyno',
  '',
  'We ran it at 29.1 in. Hg of vacuum. At the peak the **long cam** gained 108 hp over the stock one, at 5,380 rpm.',
  '',
  '::results-table',
  '::',
  '',
  '- It idled at 12.4 inHg, vs. 16.0 inHg stock.',
  '- Another 108 hp claim, in a list.',
].join('\n')

const finding = (over: Partial<NumberFinding>): NumberFinding => ({ text: '108 hp', value: 108, unit: 'hp', line: 3, nearest: [], message: '', ...over })

describe('the sentence of a finding', () => {
  it('is the sentence holding the number, without Markdown marks, split around the number', () => {
    expect(findingQuote(body, finding({}))).toEqual({ before: 'At the peak the long cam gained ', number: '108 hp', after: ' over the stock one, at 5,380 rpm.' })
  })

  it('does not end at "in. Hg" or "vs."', () => {
    expect(findingQuote(body, finding({ text: '29.1 in. Hg', line: 3 }))).toMatchObject({ before: 'We ran it at ', after: ' of vacuum.' })
    expect(findingQuote(body, finding({ text: '16.0 inHg', line: 8 }))).toEqual({ before: 'It idled at 12.4 inHg, vs. ', number: '16.0 inHg', after: ' stock.' })
  })

  it('is shortened around the number when the sentence is long', () => {
    const long = `${'Word '.repeat(80)}and then 31 hp more ${'after '.repeat(80)}end.`
    const q = findingQuote(long, finding({ text: '31 hp', line: 1 }))
    expect(q.number).toBe('31 hp')
    expect(q.before.startsWith('…')).toBe(true)
    expect(q.after.endsWith('…')).toBe(true)
    expect(q.before.length + q.after.length).toBeLessThan(240)
  })
})

describe('the note of a finding', () => {
  it('groups thousands and joins each number to its unit', () => {
    expect(findingNote(finding({ text: '5,830 rpm', value: 5830, unit: 'rpm', nearest: [{ label: 'peak power rpm, long cam', value: 5380, unit: 'rpm' }, { label: 'peak torque rpm, long cam', value: 4900, unit: 'rpm' }] })))
      .toBe('The data gives 5,380\u00a0rpm (peak power rpm, long cam). Also close: 4,900\u00a0rpm (peak torque rpm, long cam).')
    expect(findingNote(finding({ nearest: [{ label: 'peak-to-peak power gain', value: 31.4, unit: 'hp' }] }))).toBe('The data gives 31.4\u00a0hp (peak-to-peak power gain).')
    expect(findingNote(finding({ nearest: [] }))).toBe('The data gives no figure in hp.')
    // Figures that come to the same number are named once.
    expect(findingNote(finding({ text: '9,990 rpm', value: 9990, unit: 'rpm', nearest: [{ label: 'end of the power band', value: 6000, unit: 'rpm' }, { label: 'rpm of the largest gain', value: 6000, unit: 'rpm' }, { label: 'peak power rpm', value: 5600, unit: 'rpm' }] })))
      .toBe('The data gives 6,000\u00a0rpm (end of the power band). Also close: 5,600\u00a0rpm (peak power rpm).')
  })

  it('says when a number agrees with a gain inside repeatability', () => {
    expect(findingNote(finding({ matched: { label: 'peak-to-peak power gain', value: 3, withinRepeatability: true } }))).toMatch(/^Agrees with peak-to-peak power gain \(3\u00a0hp\), but that gain is within repeatability/)
  })
})

describe('placing findings beside their paragraphs', () => {
  const findings = [finding({}), finding({ text: '5,380 rpm', value: 5380, unit: 'rpm', matched: { label: 'peak power rpm', value: 5380, withinRepeatability: null } }), finding({ line: 9 })]
  const placed = placeFindings(body, findings)

  it('numbers each repeated text in order and marks what needs attention', () => {
    expect(placed.map(p => [p.text, p.occurrence, p.attention])).toEqual([['108 hp', 0, true], ['5,380 rpm', 0, false], ['108 hp', 1, true]])
  })

  it('the second "108 hp" goes beside the second block that has one', () => {
    const counts = new Map<string, number>()
    const blocks = [
      'The long cam on the dyno',
      'We ran it at 29.1 in. Hg of vacuum. At the peak the long cam gained 108 hp over the stock one, at 5,380 rpm.',
      'It idled at 12.4 inHg, vs. 16.0 inHg stock.',
      'Another 108\u00a0hp claim, in a list.',
    ]
    expect(blocks.map(b => findingsInBlock(b, placed, counts).map(p => p.key))).toEqual([[], [placed[0]!.key, placed[1]!.key], [], [placed[2]!.key]])
  })

  it('counts a number only where it stands alone, not inside a longer one', () => {
    expect(countNumber('1108 hp and 108 hp and 108.5 hp and 108 hpx', '108 hp')).toBe(1)
  })
})
