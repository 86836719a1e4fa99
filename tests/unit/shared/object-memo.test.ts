import { describe, expect, it } from 'vitest'
import { deepFreeze } from '#shared/utils/deep-freeze'
import { memoOn } from '#shared/utils/object-memo'

// Behaviour tests of two small helpers (no computation to source).
describe('memoOn', () => {
  it('works a result out once per owner and key, and again for another owner or key', () => {
    let runs = 0
    const work = (n: number) => () => {
      runs++
      return { n }
    }
    const a = {}
    const b = {}
    const first = memoOn(a, 'k', work(1))
    expect(memoOn(a, 'k', work(2))).toBe(first)
    expect(runs).toBe(1)
    expect(memoOn(a, 'other', work(3))).toEqual({ n: 3 })
    expect(memoOn(b, 'k', work(4))).toEqual({ n: 4 })
    expect(runs).toBe(3)
  })

  it('keeps falsy results too', () => {
    let runs = 0
    const owner = {}
    const zero = () => {
      runs++
      return 0
    }
    memoOn(owner, 'zero', zero)
    expect(memoOn(owner, 'zero', zero)).toBe(0)
    expect(runs).toBe(1)
  })
})

describe('deepFreeze', () => {
  it('freezes nested objects and arrays so nothing can change them in place', () => {
    const view = deepFreeze({ story: { headline: 'A' }, curves: [[1, 2], [3, 4]] })
    expect(Object.isFrozen(view.story)).toBe(true)
    expect(Object.isFrozen(view.curves[1])).toBe(true)
    expect(() => {
      'use strict'
      ;(view.curves[0] as number[]).push(5)
    }).toThrow(TypeError)
    expect(view.curves[0]).toEqual([1, 2])
  })
})
