// A cam card as the setup list shows it (issue 15 item 6): a compact table, intake
// beside exhaust, with the valve events at 0.050 in worked out by shared/dyno camEvents,
// then the figures that belong to the pair (lobe separation, centerlines, overlap).
import { camEvents } from '../dyno/cam'
import type { PartSpec } from '../types/setups'
import { formatReported } from './figures'

export type CamPart = Extract<PartSpec, { category: 'camshaft' }>

export interface CamCardTable {
  rows: { label: string, intake: string, exhaust: string }[]
  pair: { label: string, value: string }[]
}

/** Degrees as a cam card writes them: "236°", "27.5°". */
export function camDegrees(value: number): string {
  return `${formatReported(value, 1).replace(/\.0$/, '')}°`
}

/** An event on the other side of the dead centre it is named for reads as such, not as a negative angle. */
export function camEventText(value: number, usual: string, other: string): string {
  return `${camDegrees(Math.abs(value))}\u00a0${value >= 0 ? usual : other}`
}

const inches = (value: number) => `${formatReported(value, 3)}\u00a0in`

export function camCardTable(cam: CamPart): CamCardTable {
  const e = camEvents({ intakeDuration: cam.intakeDuration050Deg, exhaustDuration: cam.exhaustDuration050Deg, lsa: cam.lsaDeg, icl: cam.iclDeg })
  const optional = (v: number | undefined, show: (n: number) => string) => (v === undefined || v === null ? '–' : show(v))
  const rows: CamCardTable['rows'] = [
    { label: 'Duration at 0.050\u00a0in', intake: camDegrees(cam.intakeDuration050Deg), exhaust: camDegrees(cam.exhaustDuration050Deg) },
  ]
  if (cam.intakeAdvertisedDeg !== undefined || cam.exhaustAdvertisedDeg !== undefined) {
    rows.push({ label: 'Advertised duration', intake: optional(cam.intakeAdvertisedDeg, camDegrees), exhaust: optional(cam.exhaustAdvertisedDeg, camDegrees) })
  }
  rows.push(
    { label: 'Valve lift', intake: inches(cam.intakeLiftIn), exhaust: inches(cam.exhaustLiftIn) },
    { label: 'Opens at 0.050\u00a0in', intake: camEventText(e.ivo, 'BTDC', 'ATDC'), exhaust: camEventText(e.evo, 'BBDC', 'ABDC') },
    { label: 'Closes at 0.050\u00a0in', intake: camEventText(e.ivc, 'ABDC', 'BBDC'), exhaust: camEventText(e.evc, 'ATDC', 'BTDC') },
    { label: 'Centerline', intake: `${camDegrees(cam.iclDeg)}\u00a0ATDC`, exhaust: `${camDegrees(e.ecl)}\u00a0BTDC` },
  )
  return {
    rows,
    pair: [
      { label: 'Lobe separation', value: camDegrees(cam.lsaDeg) },
      { label: 'Overlap at 0.050\u00a0in', value: camDegrees(e.overlap) },
      { label: 'Advance', value: camDegrees(e.advance) },
    ],
  }
}
