import { describe, expect, it } from 'vitest'
import { PAGE_CURVE_STEP_RPM, pointsEvery, withPageCurves } from '#shared/utils/page-curves'
import type { MagazineStoryResponse } from '#shared/types/magazine'

const curve = (from: number, to: number, step: number) => {
  const out = []
  for (let rpm = from; rpm <= to; rpm += step) out.push({ rpm, torque: rpm / 10, power: rpm / 20 })
  return out
}

describe('pointsEvery', () => {
  it('keeps the points on every step and both ends, in order', () => {
    const kept = pointsEvery(curve(2510, 2700, 10), 50)
    expect(kept.map(p => p.rpm)).toEqual([2510, 2550, 2600, 2650, 2700])
  })

  it('leaves a curve coarser than the step as it is', () => {
    const gains = curve(2500, 3000, 100)
    expect(pointsEvery(gains, 50)).toEqual(gains)
  })
})

describe('withPageCurves', () => {
  it('thins each setup curve to the page step, keeps gains and everything else, and says so', () => {
    const setups = [{ setupId: 1, curve: curve(2500, 6500, 10) }, { setupId: 2, curve: curve(2500, 6500, 10) }]
    const gains = [{ setupId: 2, againstSetupId: 1, curve: curve(2500, 6500, 100) }]
    const view = { story: { id: 1 }, figures: { analysis: { setups, gains, standard: 'sae-j1349-1990' }, comparisons: [] } } as unknown as MagazineStoryResponse
    const page = withPageCurves(view)
    expect(page.curvesStepRpm).toBe(PAGE_CURVE_STEP_RPM)
    expect(page.figures.analysis!.setups.map(s => s.curve.length)).toEqual([81, 81])
    expect(page.figures.analysis!.setups[0]!.curve.every(p => p.rpm % 50 === 0)).toBe(true)
    expect(page.figures.analysis!.gains).toBe(view.figures.analysis!.gains)
    expect(page.story).toBe(view.story)
    // The view it came from is not changed (on the server it is the shared, frozen one).
    expect(view.figures.analysis!.setups[0]!.curve).toHaveLength(401)
    expect(view.curvesStepRpm).toBeUndefined()
  })

  it('leaves a view without analysis alone', () => {
    const view = { figures: { analysis: null } } as unknown as MagazineStoryResponse
    expect(withPageCurves(view)).toBe(view)
  })
})
