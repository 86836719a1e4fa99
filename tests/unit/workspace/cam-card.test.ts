// The setup list's cam card table (issue 15 item 6), on the worked example of
// tests/unit/dyno/cam.test.ts (cam card definitions, published: check-sources.md):
// 224/230 at 0.050 in on a 112 LSA installed at 108 ICL gives ECL 116, IVO 4 BTDC,
// IVC 40 ABDC, EVO 51 BBDC, EVC 1 BTDC (the -1 ATDC of the formula), overlap 3, advance 4.
import { describe, expect, it } from 'vitest'
import { camCardTable, camEventText, type CamPart } from '#shared/utils/cam-card'

const cam: CamPart = {
  category: 'camshaft', maker: 'Invented Cam Works', model: 'Street 224',
  intakeDuration050Deg: 224, exhaustDuration050Deg: 230, intakeAdvertisedDeg: 276,
  intakeLiftIn: 0.55, exhaustLiftIn: 0.558, lsaDeg: 112, iclDeg: 108,
} as CamPart

describe('the cam card as a compact table', () => {
  it('puts intake beside exhaust, with the events at 0.050 in on their side of the dead centre', () => {
    expect(camCardTable(cam).rows).toEqual([
      { label: 'Duration at 0.050\u00a0in', intake: '224°', exhaust: '230°' },
      { label: 'Advertised duration', intake: '276°', exhaust: '–' },
      { label: 'Valve lift', intake: '0.550\u00a0in', exhaust: '0.558\u00a0in' },
      { label: 'Opens at 0.050\u00a0in', intake: '4°\u00a0BTDC', exhaust: '51°\u00a0BBDC' },
      { label: 'Closes at 0.050\u00a0in', intake: '40°\u00a0ABDC', exhaust: '1°\u00a0BTDC' },
      { label: 'Centerline', intake: '108°\u00a0ATDC', exhaust: '116°\u00a0BTDC' },
    ])
  })

  it('gives the pair\'s own figures: lobe separation, overlap, advance', () => {
    expect(camCardTable(cam).pair).toEqual([
      { label: 'Lobe separation', value: '112°' },
      { label: 'Overlap at 0.050\u00a0in', value: '3°' },
      { label: 'Advance', value: '4°' },
    ])
  })

  it('leaves out the advertised row when the card has none, and keeps half degrees', () => {
    const rows = camCardTable({ ...cam, intakeAdvertisedDeg: undefined, intakeDuration050Deg: 224.5 }).rows
    expect(rows.map(r => r.label)).not.toContain('Advertised duration')
    expect(rows[0]!.intake).toBe('224.5°')
    expect(camEventText(-2.5, 'BTDC', 'ATDC')).toBe('2.5°\u00a0ATDC')
  })
})
