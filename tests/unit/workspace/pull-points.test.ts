import { describe, expect, it } from 'vitest'
import { decodePoints, encodePoints } from '../../../server/services/workspace/pull-points'

describe('points as one JSON document', () => {
  const points = [
    { rpm: 3000, torqueLbFt: 400.1, powerHp: 228.5, vacuumInHg: 0.4, afr: 12.8, extra: { 'EGT (F)': 1210 } },
    { rpm: 3010, torqueLbFt: 400.3, powerHp: 229.3, vacuumInHg: 0.41, afr: 12.79 },
  ]

  it('round-trips every channel, extras on request', () => {
    const text = encodePoints(points)
    expect(decodePoints(text, { extra: true })).toEqual(points)
    expect(decodePoints(text)).toEqual(points.map(({ extra: _e, ...p }) => p))
  })

  it('is smaller than an array of objects', () => {
    const many = Array.from({ length: 1000 }, (_, i) => ({ rpm: 3000 + i, torqueLbFt: 400 + i / 10, powerHp: 300 + i / 7 }))
    expect(encodePoints(many).length).toBeLessThan(JSON.stringify(many).length * 0.6)
  })

  it('leaves out channels no point has', () => {
    expect(JSON.parse(encodePoints([{ rpm: 1, torqueLbFt: 2, powerHp: 3 }]))).toEqual({ v: 1, rpm: [1], torqueLbFt: [2], powerHp: [3] })
  })

  it('reads damaged documents defensively (MariaDB JSON is LONGTEXT)', () => {
    expect(decodePoints('{not json')).toEqual([])
    expect(decodePoints(null)).toEqual([])
    expect(decodePoints('{"rpm":[1,2],"torqueLbFt":[3],"powerHp":[4,5]}')).toEqual([{ rpm: 1, torqueLbFt: 3, powerHp: 4 }])
    expect(decodePoints('{"rpm":[1,"x"],"torqueLbFt":[3,4],"powerHp":[4,5]}')).toHaveLength(1)
  })
})
