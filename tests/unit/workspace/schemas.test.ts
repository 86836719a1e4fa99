import { describe, expect, it } from 'vitest'
import { AnalysisQuery } from '#shared/types/analysis-results'
import { CreateBenchTestBody } from '#shared/types/bench-tests'
import { CommitPullsBody } from '#shared/types/pull-imports'
import { UpdatePullBody } from '#shared/types/pulls'
import { PartSpecSchema } from '#shared/types/setups'

const paths = (r: { success: boolean, error?: { issues: { path: PropertyKey[] }[] } }) => (r.error?.issues ?? []).map(i => i.path.join('.'))

describe('part specs by category', () => {
  it('accepts a full cam card and checks advertised against 0.050 in duration', () => {
    const cam = { category: 'camshaft', intakeDuration050Deg: 224, exhaustDuration050Deg: 230, intakeLiftIn: 0.57, exhaustLiftIn: 0.58, lsaDeg: 112, iclDeg: 108 }
    expect(PartSpecSchema.safeParse(cam).success).toBe(true)
    expect(paths(PartSpecSchema.safeParse({ ...cam, intakeAdvertisedDeg: 220 }))).toEqual(['intakeAdvertisedDeg'])
    expect(paths(PartSpecSchema.safeParse({ ...cam, lsaDeg: 90 }))).toEqual(['lsaDeg'])
  })

  it('needs primary sizes for headers but not for a cast manifold', () => {
    expect(PartSpecSchema.safeParse({ category: 'headers', style: 'cast-manifold' }).success).toBe(true)
    expect(paths(PartSpecSchema.safeParse({ category: 'headers', style: 'long-tube' }))).toEqual(['primaryDiameterIn', 'primaryLengthIn', 'collectorDiameterIn'])
  })

  it('knows each category and refuses others', () => {
    for (const part of [
      { category: 'intake-manifold', type: 'tunnel-ram' },
      { category: 'carburetor', airflowCfm: 750 },
      { category: 'throttle-body', boreMm: 70 },
      { category: 'cylinder-heads', intakePortCc: 210, intakeValveIn: 2.08, exhaustValveIn: 1.6 },
      { category: 'ignition-timing', totalAdvanceDeg: 34 },
      { category: 'other', title: 'Oil pan' },
    ]) expect(PartSpecSchema.safeParse(part).success, part.category).toBe(true)
    expect(paths(PartSpecSchema.safeParse({ category: 'intake-manifold', type: 'triple-plane' }))).toEqual(['type'])
    expect(paths(PartSpecSchema.safeParse({ category: 'nitrous' }))).toEqual(['category'])
  })
})

describe('request bodies', () => {
  it('orders test dates', () => {
    expect(paths(CreateBenchTestBody.safeParse({ title: 't', engineFamily: 'diesel', partType: 'fuel', testedFrom: '2026-02-02', testedTo: '2026-02-01' }))).toEqual(['testedTo'])
  })

  it('needs weather on an import unless the dyno corrected the pull', () => {
    const base = { name: 'a.csv', text: 'x', setupId: 1 }
    expect(paths(CommitPullsBody.safeParse({ files: [{ ...base, weather: null }] }))).toEqual(['files.0.weather'])
    expect(CommitPullsBody.safeParse({ files: [{ ...base, weather: null, dynoCorrected: true }] }).success).toBe(true)
  })

  it('needs a reason to exclude a pull', () => {
    expect(paths(UpdatePullBody.safeParse({ version: 1, included: false }))).toEqual(['exclusionReason'])
    expect(UpdatePullBody.safeParse({ version: 1, included: true }).success).toBe(true)
  })

  it('reads the analysis query from strings', () => {
    expect(AnalysisQuery.parse({ setups: '3,4,3', baseline: '4', maxPoints: '100' })).toEqual({ setups: [3, 4], baseline: 4, maxPoints: 100 })
    expect(AnalysisQuery.safeParse({ setups: '3;4' }).success).toBe(false)
  })
})
