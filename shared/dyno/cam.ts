// Cam card arithmetic. Durations are crank degrees at one checking lift (usually
// 0.050 in); lsa = lobe separation angle, icl = intake centerline, both cam-card
// figures in crank degrees. Events: IVO and EVC in degrees before/after TDC, IVC and
// EVO after/before BDC; a negative event means the valve opens (or closes) on the
// other side of that dead centre.

export type CamCard = { intakeDuration: number, exhaustDuration: number, lsa: number, icl: number }
export type CamEvents = { ecl: number, ivo: number, ivc: number, evo: number, evc: number, overlap: number, advance: number }

export function camEvents({ intakeDuration, exhaustDuration, lsa, icl }: CamCard): CamEvents {
  for (const [name, v] of [['intake duration', intakeDuration], ['exhaust duration', exhaustDuration], ['lobe separation', lsa]] as const) {
    if (!Number.isFinite(v) || v <= 0 || v >= 720) throw new RangeError(`${name} must be between 0 and 720 degrees (got ${v})`)
  }
  if (!Number.isFinite(icl)) throw new RangeError(`intake centerline must be a number (got ${icl})`)
  const ecl = 2 * lsa - icl // both lobes sit lsa from the cam's own centre line
  const ivo = intakeDuration / 2 - icl
  const ivc = intakeDuration / 2 + icl - 180
  const evo = exhaustDuration / 2 + ecl - 180
  const evc = exhaustDuration / 2 - ecl
  return { ecl, ivo, ivc, evo, evc, overlap: ivo + evc, advance: lsa - icl }
}
