import { describe, expect, it } from 'vitest'
import { cToF, kPaToInHg, kwToHp, nmToLbFt, parsePullCsv, powerHp, psToHp, type Problem } from '../../../shared/dyno/index'

// Our own plain CSV format (issue 3). Rows of a smooth, consistent pull: torque and
// power agree (hp = lb-ft x rpm / 5252.113, published: NIST SP 811).
const torqueAt = (rpm: number): number => 400 + 0.02 * (rpm - 2500) - 4e-6 * (rpm - 2500) ** 2
const row = (rpm: number, sep = ','): string => [rpm, torqueAt(rpm).toFixed(2), powerHp(torqueAt(rpm), rpm).toFixed(2)].join(sep)
const rows = (from = 2500, to = 6000, step = 250, sep = ','): string[] => {
  const out: string[] = []
  for (let r = from; r <= to; r += step) out.push(row(r, sep))
  return out
}
const HEADER = 'RPM,Torque (lb-ft),Power (hp)'
const file = (lines: string[]): string => lines.join('\n') + '\n'
const only = (problems: Problem[], severity: Problem['severity']): Problem[] => problems.filter(p => p.severity === severity)

describe('parsePullCsv: a good file', () => {
  const text = file(['# baro: 29.31 inHg', '# air temp: 78 F', '# humidity: 41 %', '# note: baseline, pull 2', '', HEADER, ...rows()])
  const r = parsePullCsv(text)
  it('reads points, weather, units and no problems', () => {
    expect(r.problems).toEqual([])
    expect(r.ok).toBe(true)
    expect(r.points).toHaveLength(15)
    expect(r.points[0]).toEqual({ rpm: 2500, torqueLbFt: 400, powerHp: Number(powerHp(400, 2500).toFixed(2)) })
    expect(r.weather).toEqual({ baroInHg: 29.31, airTempF: 78, humidityPct: 41 })
    expect(r.units).toEqual({ torque: 'lb-ft', power: 'hp' })
    expect(r.headerLine).toBe(6)
    expect(r.delimiter).toBe(',')
    expect(r.order).toBe('ascending')
    expect(r.columns.map(c => c.role)).toEqual(['rpm', 'torque-lb-ft', 'power-hp'])
  })
})

describe('parsePullCsv: separators, decimal comma, units, weather units', () => {
  it('semicolons with decimal commas, N-m and kW, kPa and C weather', () => {
    const lines = ['# baro: 99,3 kPa', '# air temp: 24,5 C', '# humidity: 38 %', 'Engine speed (rpm);Torque [N-m];Power (kW);Vacuum (kPa)']
    for (let r = 2500; r <= 6000; r += 250) {
      const nm = (torqueAt(r) * 1.3558179483314).toFixed(2).replace('.', ',')
      const kw = ((powerHp(torqueAt(r), r) * 745.69987158227) / 1000).toFixed(3).replace('.', ',')
      lines.push([r, nm, kw, '3,4'].join(';'))
    }
    const p = parsePullCsv(file(lines))
    expect(p.problems).toEqual([])
    expect(p.delimiter).toBe(';')
    expect(p.decimalComma).toBe(true)
    expect(p.units).toEqual({ torque: 'N-m', power: 'kW', vacuum: 'kPa' })
    expect(p.points[4]?.torqueLbFt).toBeCloseTo(nmToLbFt(Number((torqueAt(3500) * 1.3558179483314).toFixed(2))), 9)
    expect(p.points[4]?.powerHp).toBeCloseTo(kwToHp(Number(((powerHp(torqueAt(3500), 3500) * 745.69987158227) / 1000).toFixed(3))), 9)
    expect(p.points[0]?.vacuumInHg).toBeCloseTo(kPaToInHg(3.4), 9)
    expect(p.weather?.baroInHg).toBeCloseTo(kPaToInHg(99.3), 9)
    expect(p.weather?.airTempF).toBeCloseTo(cToF(24.5), 9)
  })
  it('tabs, PS power only (torque computed), mbar weather, [Nm] brackets and ft-lb spelling recognised', () => {
    const lines = ['# baro: 1008 mbar', 'rpm\tPower (PS)\tAFR']
    for (let r = 2500; r <= 6000; r += 250) lines.push([r, (powerHp(torqueAt(r), r) / 0.98632).toFixed(2), '12.8'].join('\t'))
    const p = parsePullCsv(file(lines))
    expect(p.problems).toEqual([])
    expect(p.delimiter).toBe('\t')
    expect(p.units).toEqual({ power: 'PS' })
    expect(p.points[0]?.afr).toBe(12.8)
    expect(p.points[0]?.powerHp).toBeCloseTo(psToHp(Number((powerHp(400, 2500) / 0.98632).toFixed(2))), 9)
    expect(p.points[0]?.torqueLbFt).toBeCloseTo((p.points[0]!.powerHp * 5252.113122) / 2500, 4) // torque from power
    expect(p.weather?.baroInHg).toBeCloseTo(29.766, 3)
    expect(parsePullCsv(file(['RPM,Torque [Nm]', ...rows().map(l => l.split(',').slice(0, 2).join(','))])).units.torque).toBe('N-m')
    expect(parsePullCsv(file(['RPM,Torque (ft-lb)', ...rows().map(l => l.split(',').slice(0, 2).join(','))])).units.torque).toBe('lb-ft')
  })
  it('torque only: power is computed (hp = lb-ft x rpm / 5252.113)', () => {
    const p = parsePullCsv(file(['RPM,Torque (lb-ft)', ...rows().map(l => l.split(',').slice(0, 2).join(','))]))
    expect(p.points[6]?.powerHp).toBeCloseTo(powerHp(p.points[6]!.torqueLbFt, p.points[6]!.rpm), 9)
  })
  it('unknown columns are kept as extra channels and reported', () => {
    const p = parsePullCsv(file(['RPM,Torque (lb-ft),Power (hp),Oil temp (F),EGT 1 (F)', ...rows().map((l, i) => `${l},${200 + i},${1300 + i}`)]))
    expect(p.extraColumns).toEqual(['Oil temp (F)', 'EGT 1 (F)'])
    expect(p.points[2]?.extra).toEqual({ 'Oil temp (F)': 202, 'EGT 1 (F)': 1302 })
    expect(p.problems).toEqual([])
  })
  it('a column mapping gives roles to headers the parser does not know', () => {
    const lines = ['Drehzahl;Moment;Leistung', ...rows(2500, 6000, 250, ';')]
    const unmapped = parsePullCsv(file(lines))
    expect(unmapped.ok).toBe(false)
    expect(unmapped.extraColumns).toEqual(['Drehzahl', 'Moment', 'Leistung'])
    const mapped = parsePullCsv(file(lines), { columns: { drehzahl: 'rpm', MOMENT: 'torque-lb-ft', Leistung: 'power-hp' } })
    expect(mapped.problems).toEqual([])
    expect(mapped.points).toHaveLength(15)
  })
  it('a BOM and CRLF line ends keep line numbers right', () => {
    const text = '\ufeff# baro: 29.9 inHg\r\n' + [HEADER, ...rows()].join('\r\n').replace(/^(2750,.*)$/m, '2750,abc,1') + '\r\n'
    const p = parsePullCsv(text)
    expect(p.weather?.baroInHg).toBe(29.9)
    expect(p.problems).toEqual([{ severity: 'error', line: 4, column: 'Torque (lb-ft)', message: expect.stringMatching(/"abc"/) }])
  })
  it('a quoted cell with a line break moves later line numbers down', () => {
    const lines = ['RPM,Torque (lb-ft),Power (hp),Note', ...rows().map(l => `${l},`)]
    lines[2] = lines[2]!.replace(/,$/, ',"first\nsecond"')
    lines[5] = lines[5]!.replace(/^(\d+),/, '$1,x')
    const p = parsePullCsv(file(lines))
    const err = only(p.problems, 'error')
    expect(err).toHaveLength(1)
    expect(err[0]?.line).toBe(7) // file line 6, pushed down one by the break inside the quotes
  })
})

describe('parsePullCsv: every bad-input rule (severity and line)', () => {
  it('non-numeric cell: error with line and column', () => {
    const lines = [HEADER, ...rows()]
    lines[3] = '3000,four hundred,230'
    const p = parsePullCsv(file(lines))
    expect(p.problems).toEqual([{ severity: 'error', line: 4, column: 'Torque (lb-ft)', message: '"four hundred" in column "Torque (lb-ft)" is not a number' }])
    expect(p.ok).toBe(false)
    expect(p.points).toHaveLength(14)
  })
  it('missing cells (empty, or a short row): error with line and column', () => {
    const lines = ['# air temp: 70 F', HEADER, ...rows()]
    lines[4] = '3000,,230'
    lines[7] = '3750,410'
    const err = only(parsePullCsv(file(lines)).problems, 'error')
    expect(err.map(e => [e.severity, e.line, e.column])).toEqual([
      ['error', 5, 'Torque (lb-ft)'],
      ['error', 8, 'Power (hp)'],
    ])
  })
  it('no rpm column: error at the header line', () => {
    const p = parsePullCsv(file(['# baro: 29.9 inHg', 'Torque (lb-ft),Power (hp)', '400,190', '410,200']))
    expect(p.problems).toEqual([{ severity: 'error', line: 2, message: expect.stringMatching(/no rpm column/) }])
  })
  it('neither torque nor power: error at the header line', () => {
    const p = parsePullCsv(file(['RPM,AFR', '3000,12.8', '3100,12.7']))
    expect(p.problems).toEqual([{ severity: 'error', line: 1, message: expect.stringMatching(/neither a torque nor a power/) }])
  })
  it('no header at all: error at the first line', () => {
    const p = parsePullCsv(file(rows()))
    expect(p.problems).toEqual([{ severity: 'error', line: 1, message: expect.stringMatching(/not column names/) }])
    expect(parsePullCsv('\n\n# baro: 29.9 inHg\n').problems[0]).toMatchObject({ severity: 'error' })
  })
  it('fewer than 10 points: error for the whole file', () => {
    const p = parsePullCsv(file([HEADER, ...rows(2500, 6000, 500)])) // 8 rows
    expect(p.problems.filter(x => /at least 10/.test(x.message))).toEqual([{ severity: 'error', message: expect.any(String) }])
  })
  it('less than 1000 rpm covered: error for the whole file', () => {
    const p = parsePullCsv(file([HEADER, ...rows(3000, 3900, 50)])) // 19 rows over 900 rpm
    expect(p.problems).toEqual([{ severity: 'error', message: expect.stringMatching(/3000 to 3900 rpm; it needs at least 1000/) }])
  })
  it('descending rows: accepted silently and sorted', () => {
    const p = parsePullCsv(file([HEADER, ...rows().reverse()]))
    expect(p.problems).toEqual([])
    expect(p.order).toBe('descending')
    expect(p.points.map(x => x.rpm)).toEqual([...p.points.map(x => x.rpm)].sort((a, b) => a - b))
  })
  it('rows that change direction (two sweeps in one file): warning where it turns, then sorted', () => {
    const r = rows()
    const p = parsePullCsv(file([HEADER, ...r.slice(0, 8), ...r.slice(8).reverse()]))
    expect(p.order).toBe('mixed')
    expect(p.problems).toEqual([{ severity: 'warning', line: 11, message: expect.stringMatching(/6000 to 5750 rpm/) }]) // 6000 on line 10, back to 5750 on line 11
    expect(p.points[8]?.rpm).toBe(4500)
  })
  it('duplicate rpm: averaged, warning at the repeated line', () => {
    const lines = [HEADER, ...rows()]
    lines.splice(5, 0, '3250,420.00,260.00') // line 6 repeats 3250 rpm (line 5)
    const p = parsePullCsv(file(lines))
    const w = only(p.problems, 'warning').filter(x => /appears again/.test(x.message))
    expect(w).toEqual([{ severity: 'warning', line: 6, message: '3250 rpm appears again (first at line 5); the rows are averaged' }])
    const at = p.points.find(x => x.rpm === 3250)!
    expect(at.torqueLbFt).toBeCloseTo((torqueAt(3250) + 420) / 2, 2)
    expect(p.points.filter(x => x.rpm === 3250)).toHaveLength(1)
  })
  it('gap over 500 rpm: warning at the line after the gap', () => {
    const r = rows(2500, 6000, 100)
    const p = parsePullCsv(file([HEADER, ...r.filter(l => !/^(40|41|42|43|44|45)00,/.test(l))])) // 2500..3900 on lines 2-16, then 4600 on line 17
    const gap = p.problems.filter(x => /gap/.test(x.message))
    expect(gap).toEqual([{ severity: 'warning', line: 17, message: 'gap of 700 rpm between 3900 and 4600 rpm' }])
    // exactly 500 is not a gap
    expect(parsePullCsv(file([HEADER, ...rows(2500, 6000, 500), ...rows(6500, 7500, 500)])).problems.some(x => /gap/.test(x.message))).toBe(false)
  })
  it('torque and power disagreeing by more than 1 %: one warning per line', () => {
    const lines = [HEADER, ...rows()]
    lines[4] = `3250,${torqueAt(3250).toFixed(2)},${(powerHp(torqueAt(3250), 3250) * 1.04).toFixed(2)}` // power 4 % corrected
    lines[6] = `3750,${torqueAt(3750).toFixed(2)},${(powerHp(torqueAt(3750), 3750) * 1.009).toFixed(2)}` // 0.9 %: fine
    lines[9] = `4500,${torqueAt(4500).toFixed(2)},${(powerHp(torqueAt(4500), 4500) * 0.97).toFixed(2)}`
    const w = parsePullCsv(file(lines)).problems
    expect(w.map(x => [x.severity, x.line])).toEqual([['warning', 5], ['warning', 10]])
    expect(w[0]?.message).toMatch(/disagree by 4\.0 %/)
  })
  it('a spike (far from both neighbours while they agree): warning at its line', () => {
    const lines = ['RPM,Torque (lb-ft)', ...rows(2500, 6000, 50).map(l => l.split(',').slice(0, 2).join(','))]
    lines[21] = `3500,${(torqueAt(3500) * 1.12).toFixed(2)}` // line 22
    const p = parsePullCsv(file(lines))
    expect(p.problems).toEqual([{ severity: 'warning', line: 22, message: expect.stringMatching(/spike at 3500 rpm/) }])
  })
  it('a steep but smooth curve is no spike', () => {
    const lines = ['RPM,Torque (lb-ft)']
    for (let r = 2000; r <= 7000; r += 500) lines.push(`${r},${(100 + 0.08 * (r - 2000)).toFixed(1)}`)
    expect(parsePullCsv(file(lines)).problems).toEqual([])
  })
  it('implausible values: negative torque or power, rpm above 20000, rpm of 0: errors with line and column', () => {
    const lines = [HEADER, ...rows()]
    lines[2] = '2750,-5,200'
    lines[5] = '25000,400,1900'
    lines[7] = '3750,410,-1'
    lines[8] = '0,410,0'
    const err = only(parsePullCsv(file(lines)).problems, 'error')
    expect(err.map(e => [e.line, e.column])).toEqual([
      [3, 'Torque (lb-ft)'],
      [6, 'RPM'],
      [8, 'Power (hp)'],
      [9, 'RPM'],
    ])
  })
  it('a torque column with no unit is read as lb-ft with a warning; an unknown unit is an error', () => {
    const noUnit = parsePullCsv(file(['RPM,Torque', ...rows().map(l => l.split(',').slice(0, 2).join(','))]))
    expect(noUnit.problems).toEqual([{ severity: 'warning', line: 1, column: 'Torque', message: 'column "Torque" names no unit; read as lb-ft' }])
    const badUnit = parsePullCsv(file(['RPM,Torque (kgm)', ...rows().map(l => l.split(',').slice(0, 2).join(','))]))
    expect(badUnit.problems[0]).toMatchObject({ severity: 'error', line: 1, column: 'Torque (kgm)' })
  })
  it('a second torque column is kept as an extra channel, with a warning', () => {
    const p = parsePullCsv(file(['RPM,Torque (lb-ft),Corrected torque (lb-ft)', ...rows().map(l => l.split(',').slice(0, 2).join(',') + ',1')]))
    expect(p.problems).toEqual([{ severity: 'warning', line: 1, column: 'Corrected torque (lb-ft)', message: expect.stringMatching(/extra channel/) }])
    expect(p.extraColumns).toEqual(['Corrected torque (lb-ft)'])
  })
  it('text in an extra column: one warning, at its first line', () => {
    const p = parsePullCsv(file(['RPM,Torque (lb-ft),Power (hp),Note', ...rows().map((l, i) => `${l},${i === 3 || i === 5 ? 'misfire' : ''}`)]))
    expect(p.problems).toEqual([{ severity: 'warning', line: 5, column: 'Note', message: expect.stringMatching(/holds text/) }])
  })
  it('weather lines: impossible humidity is an error, a missing unit or odd baro a warning, each at its line', () => {
    const p = parsePullCsv(file(['# humidity: 140 %', '# baro: 29.9', '# air temp: 75 F', '# baro: 12 inHg', HEADER, ...rows()]))
    expect(p.problems.map(x => [x.severity, x.line])).toEqual([['error', 1], ['warning', 2], ['warning', 4]])
    expect(p.weather).toEqual({ airTempF: 75, baroInHg: 12 })
  })
  it('blank lines and separator-only lines are ignored but counted', () => {
    const lines = [HEADER, ...rows()]
    lines.splice(3, 0, '', ',,')
    lines[8] = '3750,x,1'
    const p = parsePullCsv(file(lines))
    expect(p.problems).toEqual([{ severity: 'error', line: 9, column: 'Torque (lb-ft)', message: expect.any(String) }])
  })
})
