// Points of a pull as one JSON document in columns ({ rpm: [...], torqueLbFt: [...] }):
// about half the size of an array of objects, and as fast to parse.
import type { PullPoint } from '../../../shared/dyno/index'

interface PointColumns {
  v: 1
  rpm: number[]
  torqueLbFt: number[]
  powerHp: number[]
  vacuumInHg?: (number | null)[]
  afr?: (number | null)[]
  extra?: Record<string, (number | null)[]>
}

export function encodePoints(points: readonly PullPoint[]): string {
  const doc: PointColumns = { v: 1, rpm: [], torqueLbFt: [], powerHp: [] }
  const hasVacuum = points.some(p => p.vacuumInHg !== undefined)
  const hasAfr = points.some(p => p.afr !== undefined)
  const extraNames = [...new Set(points.flatMap(p => Object.keys(p.extra ?? {})))]
  if (hasVacuum) doc.vacuumInHg = []
  if (hasAfr) doc.afr = []
  if (extraNames.length) doc.extra = Object.fromEntries(extraNames.map(n => [n, []]))
  for (const p of points) {
    doc.rpm.push(p.rpm)
    doc.torqueLbFt.push(p.torqueLbFt)
    doc.powerHp.push(p.powerHp)
    doc.vacuumInHg?.push(p.vacuumInHg ?? null)
    doc.afr?.push(p.afr ?? null)
    for (const name of extraNames) doc.extra![name]!.push(p.extra?.[name] ?? null)
  }
  return JSON.stringify(doc)
}

const finite = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v)

/** Back to points; a damaged document gives the points that are whole, never a crash. */
export function decodePoints(raw: unknown, opts: { extra?: boolean } = {}): PullPoint[] {
  let doc: Partial<PointColumns>
  try { doc = typeof raw === 'string' ? JSON.parse(raw) : (raw as Partial<PointColumns>) ?? {} }
  catch { return [] }
  const { rpm, torqueLbFt, powerHp } = doc
  if (!Array.isArray(rpm) || !Array.isArray(torqueLbFt) || !Array.isArray(powerHp)) return []
  const points: PullPoint[] = []
  for (let i = 0; i < rpm.length; i++) {
    const r = rpm[i]
    const t = torqueLbFt[i]
    const h = powerHp[i]
    if (!finite(r) || !finite(t) || !finite(h)) continue
    const p: PullPoint = { rpm: r, torqueLbFt: t, powerHp: h }
    const vac = doc.vacuumInHg?.[i]
    if (finite(vac)) p.vacuumInHg = vac
    const afr = doc.afr?.[i]
    if (finite(afr)) p.afr = afr
    if (opts.extra && doc.extra) {
      for (const [name, values] of Object.entries(doc.extra)) {
        const v = Array.isArray(values) ? values[i] : undefined
        if (finite(v)) (p.extra ??= {})[name] = v
      }
    }
    points.push(p)
  }
  return points
}
