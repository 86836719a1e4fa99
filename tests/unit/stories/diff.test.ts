import { describe, expect, it } from 'vitest'
import { diffLines } from '#shared/utils/story-diff'

describe('line diff of two bodies', () => {
  it('marks changed lines and keeps the rest', () => {
    expect(diffLines('a\nb\nc\nd', 'a\nB\nc\nd\ne')).toEqual([
      { kind: 'same', text: 'a' },
      { kind: 'removed', text: 'b' },
      { kind: 'added', text: 'B' },
      { kind: 'same', text: 'c' },
      { kind: 'same', text: 'd' },
      { kind: 'added', text: 'e' },
    ])
  })

  it('gives the longest common run (textbook LCS example: ABCBDAB vs BDCABA has length 4)', () => {
    const diff = diffLines('A\nB\nC\nB\nD\nA\nB', 'B\nD\nC\nA\nB\nA')
    expect(diff.filter(d => d.kind === 'same')).toHaveLength(4)
    expect(diff.filter(d => d.kind !== 'added').map(d => d.text).join('')).toBe('ABCBDAB')
    expect(diff.filter(d => d.kind !== 'removed').map(d => d.text).join('')).toBe('BDCABA')
  })

  it('is all same for equal bodies', () => {
    expect(diffLines('x\ny', 'x\ny').every(d => d.kind === 'same')).toBe(true)
  })
})
