// Reading a pull file in Pullsheet's own plain CSV format:
//
//   # baro: 29.31 inHg          <- optional weather lines before the header
//   # air temp: 78 F               (baro in inHg, kPa or mbar; temp in F or C; humidity in %)
//   # humidity: 41 %
//   RPM,Torque (lb-ft),Power (hp),Vacuum (inHg),AFR
//   3000,412.3,235.5,0.4,12.9
//
// Comma, semicolon or tab separated (taken from the header line); with semicolons or
// tabs a decimal comma is accepted. Headers are case-insensitive with the unit in
// parentheses or brackets; unknown columns are kept as extra channels. Everything is
// normalised to lb-ft, hp and inHg. Every problem names the file's 1-based line.
// papaparse does the CSV level (quotes, line ends); this file does the meaning.

import { DISAGREEMENT_CODE, groupRepeatedProblems } from './problems'
import Papa from 'papaparse'
import type { PowerUnit, Problem, PullPoint, TorqueUnit, VacuumUnit, Weather } from './types'
import { kPaToInHg, kwToHp, mbarToInHg, nmToLbFt, cToF, psToHp, powerHp, torqueLbFt } from './units'

export const COLUMN_ROLES = [
  'rpm',
  'torque-lb-ft',
  'torque-n-m',
  'power-hp',
  'power-kw',
  'power-ps',
  'vacuum-inhg',
  'vacuum-kpa',
  'afr',
  'extra',
  'ignore',
] as const
export type ColumnRole = (typeof COLUMN_ROLES)[number]

export type ParseOptions = {
  /** Roles for headers the parser does not recognise (or reads wrongly), keyed by header, case-insensitive. */
  columns?: Record<string, ColumnRole>
}

export type ParsedPull = {
  points: PullPoint[]
  problems: Problem[]
  weather?: Partial<Weather>
  /** Units found in the file (the points themselves are always lb-ft, hp, inHg). */
  units: { torque?: TorqueUnit, power?: PowerUnit, vacuum?: VacuumUnit }
  /** Every header with the role it was read as. */
  columns: { header: string, role: ColumnRole }[]
  /** Headers kept as extra channels (in points[i].extra). */
  extraColumns: string[]
  delimiter: ',' | ';' | '\t'
  decimalComma: boolean
  headerLine?: number
  /** Order of the rows in the file; the points are always ascending. */
  order: 'ascending' | 'descending' | 'mixed'
  /** No errors: the pull may be imported. */
  ok: boolean
}

export const MAX_RPM = 20000
export const MIN_POINTS = 10
export const MIN_SPAN_RPM = 1000
export const MAX_GAP_RPM = 500
/** Torque and power columns disagreeing by more than this (percent) are flagged. */
export const MAX_DISAGREEMENT_PCT = 1
/** A spike sits this far (percent) off the line through its neighbours... */
export const SPIKE_PCT = 5

// ---------- headers ----------

const norm = (s: string): string => s.toLowerCase().replace(/\s+/g, ' ').trim()
const unitKey = (s: string): string => s.toLowerCase().replace(/[\s\-.·⋅*_°"]/g, '')

const RPM_NAMES = new Set(['rpm', 'engine speed', 'engine rpm', 'speed', 'revs'])
const RPM_UNITS = new Set(['rpm', '1/min', 'min1', 'r/min', 'rev/min'])
const TORQUE_UNITS: Record<string, ColumnRole> = {
  lbft: 'torque-lb-ft', ftlb: 'torque-lb-ft', lbfft: 'torque-lb-ft', ftlbf: 'torque-lb-ft',
  ftlbs: 'torque-lb-ft', lbsft: 'torque-lb-ft', nm: 'torque-n-m',
}
const POWER_UNITS: Record<string, ColumnRole> = { hp: 'power-hp', bhp: 'power-hp', kw: 'power-kw', ps: 'power-ps' }
const VACUUM_UNITS: Record<string, ColumnRole> = { inhg: 'vacuum-inhg', hg: 'vacuum-inhg', kpa: 'vacuum-kpa' }
const AFR_NAMES = new Set(['afr', 'af', 'airfuel', 'airfuelratio', 'afratio'])
const DEFAULT_ROLE = { torque: 'torque-lb-ft', power: 'power-hp', vacuum: 'vacuum-inhg' } as const

type Kind = 'torque' | 'power' | 'vacuum'
type Recognised = { role: ColumnRole, assumedUnit?: boolean } | { role: 'ignore', badUnit: { kind: Kind, unit: string } }

function recognise(header: string): Recognised {
  const m = /^(.*?)\s*[([]\s*([^)\]]*?)\s*[)\]]\s*$/.exec(header.trim())
  const name = norm(m ? (m[1] ?? '') : header)
  const unit = m ? unitKey(m[2] ?? '') : undefined
  if (unit !== undefined ? RPM_UNITS.has(unit) : RPM_NAMES.has(name)) return { role: 'rpm' }
  if (unit === undefined && name === 'hp') return { role: 'power-hp' }
  if (unit === undefined && name === 'kw') return { role: 'power-kw' }
  if (AFR_NAMES.has(name.replace(/[^a-z]/g, ''))) return { role: 'afr' }
  const kind: Kind | undefined = /\btorque\b|^tq$/.test(name)
    ? 'torque'
    : /\b(power|horsepower)\b/.test(name)
      ? 'power'
      : /\b(vacuum|vac)\b/.test(name)
        ? 'vacuum'
        : undefined
  if (!kind) return { role: 'extra' }
  if (unit === undefined || unit === '') return { role: DEFAULT_ROLE[kind], assumedUnit: true }
  const table = kind === 'torque' ? TORQUE_UNITS : kind === 'power' ? POWER_UNITS : VACUUM_UNITS
  const role = table[unit]
  return role ? { role } : { role: 'ignore', badUnit: { kind, unit: m?.[2] ?? '' } }
}

const KNOWN_UNITS: Record<Kind, string> = { torque: 'lb-ft, ft-lb, N-m', power: 'hp, kW, PS', vacuum: 'inHg, kPa' }

// ---------- numbers ----------

const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/
const DECIMAL_COMMA = /^[+-]?\d*,\d+$/

function readNumber(cell: string, decimalComma: boolean): number | undefined {
  const t = cell.trim()
  const s = decimalComma && DECIMAL_COMMA.test(t) ? t.replace(',', '.') : t
  return NUMBER.test(s) ? Number(s) : undefined
}

// ---------- weather lines ----------

const WEATHER_LINE = /^#\s*([^:=]+?)\s*[:=]\s*(.*?)\s*$/
const VALUE_UNIT = /^([+-]?\d+(?:[.,]\d+)?)\s*(.*)$/
const BARO_KEYS = new Set(['baro', 'barometer', 'barometric pressure', 'baro pressure', 'pressure'])
const TEMP_KEYS = new Set(['air temp', 'air temperature', 'intake air temp', 'intake air temperature', 'temp', 'temperature'])
const HUMIDITY_KEYS = new Set(['humidity', 'relative humidity', 'rh'])

function readWeatherLine(raw: string, line: number, weather: Partial<Weather>, problems: Problem[]): void {
  const m = WEATHER_LINE.exec(raw.trim())
  if (!m) return
  const key = norm(m[1] ?? '')
  const field: keyof Weather | undefined = BARO_KEYS.has(key)
    ? 'baroInHg'
    : TEMP_KEYS.has(key)
      ? 'airTempF'
      : HUMIDITY_KEYS.has(key)
        ? 'humidityPct'
        : undefined
  if (!field) return // any other "# key: value" line is a note
  const v = VALUE_UNIT.exec(m[2] ?? '')
  const warn = (message: string): void => void problems.push({ severity: 'warning', line, message })
  if (!v) return warn(`weather line "${raw.trim()}" has no number; it is not used`)
  const value = Number((v[1] ?? '').replace(',', '.'))
  const unit = unitKey(v[2] ?? '')
  let converted: number | undefined
  if (field === 'baroInHg') {
    converted = unit === 'inhg' || unit === 'hg' ? value : unit === 'kpa' ? kPaToInHg(value) : unit === 'mbar' || unit === 'hpa' ? mbarToInHg(value) : undefined
    if (converted === undefined) return warn(`barometric pressure "${m[2]}" needs a unit (inHg, kPa or mbar); it is not used`)
    if (!(converted > 0)) return void problems.push({ severity: 'error', line, message: `barometric pressure ${m[2]} is impossible` })
    if (converted < 15 || converted > 32.5) warn(`barometric pressure ${m[2]} is far outside the usual range`)
  }
  else if (field === 'airTempF') {
    converted = unit === 'f' || unit === 'degf' ? value : unit === 'c' || unit === 'degc' ? cToF(value) : undefined
    if (converted === undefined) return warn(`air temperature "${m[2]}" needs a unit (F or C); it is not used`)
    if (converted <= -459.67) return void problems.push({ severity: 'error', line, message: `air temperature ${m[2]} is below absolute zero` })
    if (converted < -40 || converted > 140) warn(`air temperature ${m[2]} is far outside the usual range`)
  }
  else {
    if (unit !== '' && unit !== '%' && unit !== 'pct' && unit !== 'percent') {
      return warn(`humidity "${m[2]}" should be a relative humidity in %; it is not used`)
    }
    converted = value
    if (value < 0 || value > 100) {
      return void problems.push({ severity: 'error', line, message: `relative humidity ${m[2]} is outside 0 to 100 %` })
    }
  }
  if (weather[field] !== undefined) warn(`weather "${key}" is given twice; the later line is used`)
  weather[field] = converted
}

// ---------- lines ----------

/** Count line breaks (\r\n, \r or \n each count once) in text[from, to). */
function countBreaks(text: string, from: number, to: number): number {
  let n = 0
  for (let i = from; i < to; i++) {
    const c = text.charCodeAt(i)
    if (c === 10) n++
    else if (c === 13 && text.charCodeAt(i + 1) !== 10) n++
  }
  return n
}

function detectDelimiter(headerLine: string): ',' | ';' | '\t' {
  const count = (ch: string): number => headerLine.split(ch).length - 1
  const tabs = count('\t')
  const semis = count(';')
  const commas = count(',')
  if (tabs > 0 && tabs >= semis && tabs >= commas) return '\t'
  if (semis > 0 && semis >= commas) return ';'
  return ','
}

// ---------- the parser ----------

type Row = {
  line: number
  rpm: number
  torque?: number // lb-ft, as given
  power?: number // hp, as given
  vacuum?: number
  afr?: number
  extra?: Record<string, number>
}

type Column = { index: number, header: string, role: ColumnRole }

export function parsePullCsv(text: string, opts: ParseOptions = {}): ParsedPull {
  const problems: Problem[] = []
  const weather: Partial<Weather> = {}
  const result = (partial: Partial<ParsedPull>): ParsedPull => {
    const out: ParsedPull = {
      points: [],
      units: {},
      columns: [],
      extraColumns: [],
      delimiter: ',',
      decimalComma: false,
      order: 'ascending',
      ...partial,
      // One summary per kind of warning repeated on many lines, the lines on demand.
      problems: groupRepeatedProblems(problems),
      ok: !problems.some(p => p.severity === 'error'),
    }
    if (Object.keys(weather).length > 0) out.weather = weather
    return out
  }

  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text

  // Weather and notes come before the header; the header is the first other non-blank line.
  let offset = 0
  let line = 1
  let headerLine: number | undefined
  let headerText = ''
  for (;;) {
    const br = /\r\n|\r|\n/g
    br.lastIndex = offset
    const m = br.exec(body)
    const end = m ? m.index : body.length
    const raw = body.slice(offset, end)
    const trimmed = raw.trim()
    if (trimmed.startsWith('#')) readWeatherLine(raw, line, weather, problems)
    else if (trimmed.replace(/[,;\t]/g, '') !== '') {
      headerLine = line
      headerText = raw
      break
    }
    if (!m) break
    offset = end + m[0].length
    line++
  }
  if (headerLine === undefined) {
    problems.push({ severity: 'error', message: 'the file has no header row and no data' })
    return result({})
  }

  const delimiter = detectDelimiter(headerText)
  const mapping = new Map(Object.entries(opts.columns ?? {}).map(([h, r]) => [norm(h), r]))
  const parsed: { line: number, cells: string[] }[] = []
  const csvText = body.slice(offset)
  // papaparse's cursor is where the row ended; the next row starts there.
  let rowStart = 0
  let counted = 0
  let papaLine = headerLine
  Papa.parse<string[]>(csvText, {
    delimiter,
    skipEmptyLines: false,
    step: (res) => {
      papaLine += countBreaks(csvText, counted, rowStart)
      counted = rowStart
      for (const e of res.errors) {
        problems.push({ severity: 'error', line: papaLine, message: `the file cannot be read here: ${e.message}` })
      }
      parsed.push({ line: papaLine, cells: res.data })
      rowStart = res.meta.cursor
    },
  })

  const headerCells = parsed[0]?.cells ?? []
  if (headerCells.length > 0 && headerCells.every(c => c.trim() === '' || readNumber(c, true) !== undefined)) {
    problems.push({ severity: 'error', line: headerLine, message: 'the first row holds numbers, not column names: add a header row' })
    return result({ delimiter, headerLine })
  }

  // Roles of the columns: the caller's mapping first, then the headers themselves.
  const columns: Column[] = []
  const taken = new Map<'rpm' | Kind | 'afr', Column>()
  headerCells.forEach((cell, index) => {
    const header = cell.trim()
    if (header === '') {
      columns.push({ index, header, role: 'ignore' })
      return
    }
    const mapped = mapping.get(norm(header))
    const rec: Recognised = mapped ? { role: mapped } : recognise(header)
    if ('badUnit' in rec) {
      problems.push({
        severity: 'error',
        line: headerLine,
        column: header,
        message: `unit "${rec.badUnit.unit}" of ${rec.badUnit.kind} column "${header}" is not one Pullsheet reads (${KNOWN_UNITS[rec.badUnit.kind]}); map the column or fix its header`,
      })
    }
    else if (rec.assumedUnit) {
      problems.push({
        severity: 'warning',
        line: headerLine,
        column: header,
        message: `column "${header}" names no unit; read as ${rec.role.replace(/^[a-z]+-/, '')}`,
      })
    }
    let role = rec.role
    const group = role === 'rpm' || role === 'afr' ? role : role.startsWith('torque') ? 'torque' : role.startsWith('power') ? 'power' : role.startsWith('vacuum') ? 'vacuum' : undefined
    if (group) {
      const first = taken.get(group)
      if (first) {
        problems.push({
          severity: 'warning',
          line: headerLine,
          column: header,
          message: `"${first.header}" is already the ${group} column; "${header}" is kept as an extra channel`,
        })
        role = 'extra'
      }
      else taken.set(group, { index, header, role })
    }
    columns.push({ index, header, role })
  })
  const roleColumns = columns.map(({ header, role }) => ({ header, role }))
  const extraColumns = columns.filter(c => c.role === 'extra')
  const base = { delimiter, headerLine, columns: roleColumns, extraColumns: extraColumns.map(c => c.header) }

  const rpmCol = taken.get('rpm')
  const torqueCol = taken.get('torque')
  const powerCol = taken.get('power')
  const vacuumCol = taken.get('vacuum')
  const afrCol = taken.get('afr')
  if (!rpmCol) problems.push({ severity: 'error', line: headerLine, message: 'no rpm column (a header such as "RPM" or "Engine speed (rpm)")' })
  if (!torqueCol && !powerCol) {
    problems.push({ severity: 'error', line: headerLine, message: 'neither a torque nor a power column (such as "Torque (lb-ft)" or "Power (hp)")' })
  }
  const units: ParsedPull['units'] = {}
  if (torqueCol) units.torque = torqueCol.role === 'torque-n-m' ? 'N-m' : 'lb-ft'
  if (powerCol) units.power = powerCol.role === 'power-kw' ? 'kW' : powerCol.role === 'power-ps' ? 'PS' : 'hp'
  if (vacuumCol) units.vacuum = vacuumCol.role === 'vacuum-kpa' ? 'kPa' : 'inHg'
  if (!rpmCol || (!torqueCol && !powerCol)) return result({ ...base, units })

  // ---- rows ----
  const decimalComma = delimiter !== ',' && parsed.some(r => r.cells.some(c => DECIMAL_COMMA.test(c.trim())))
  const toLbFt = (v: number): number => (torqueCol?.role === 'torque-n-m' ? nmToLbFt(v) : v)
  const toHp = (v: number): number => (powerCol?.role === 'power-kw' ? kwToHp(v) : powerCol?.role === 'power-ps' ? psToHp(v) : v)
  const toInHg = (v: number): number => (vacuumCol?.role === 'vacuum-kpa' ? kPaToInHg(v) : v)
  const textInExtra = new Set<string>()
  const rows: Row[] = []

  for (const { line: rowLine, cells } of parsed.slice(1)) {
    if (cells.every(c => c.trim() === '')) continue
    if ((cells[0] ?? '').trim().startsWith('#')) continue
    let bad = false
    const read = (col: Column | undefined): number | undefined => {
      if (!col) return undefined
      const cell = cells[col.index]
      if (cell === undefined || cell.trim() === '') {
        problems.push({ severity: 'error', line: rowLine, column: col.header, message: `missing value in column "${col.header}"` })
        bad = true
        return undefined
      }
      const v = readNumber(cell, decimalComma)
      if (v === undefined) {
        problems.push({ severity: 'error', line: rowLine, column: col.header, message: `"${cell.trim()}" in column "${col.header}" is not a number` })
        bad = true
      }
      return v
    }
    const rpm = read(rpmCol)
    const torqueRaw = read(torqueCol)
    const powerRaw = read(powerCol)
    const vacuumRaw = read(vacuumCol)
    const afr = read(afrCol)
    if (bad || rpm === undefined) continue

    const implausible = (col: Column | undefined, why: string): void => {
      problems.push({ severity: 'error', line: rowLine, ...(col ? { column: col.header } : {}), message: why })
      bad = true
    }
    if (!(rpm > 0) || rpm > MAX_RPM) implausible(rpmCol, `engine speed ${rpm} rpm is not plausible (above 0 and up to ${MAX_RPM} rpm)`)
    if (torqueRaw !== undefined && torqueRaw < 0) implausible(torqueCol, `negative torque ${torqueRaw}`)
    if (powerRaw !== undefined && powerRaw < 0) implausible(powerCol, `negative power ${powerRaw}`)
    if (afr !== undefined && !(afr > 0)) implausible(afrCol, `air-fuel ratio ${afr} is not plausible`)
    // Vacuum may read below zero under boost, so only its sign is free.
    if (bad) continue

    const row: Row = { line: rowLine, rpm }
    if (torqueRaw !== undefined) row.torque = toLbFt(torqueRaw)
    if (powerRaw !== undefined) row.power = toHp(powerRaw)
    if (vacuumRaw !== undefined) row.vacuum = toInHg(vacuumRaw)
    if (afr !== undefined) row.afr = afr
    for (const col of extraColumns) {
      const cell = cells[col.index]
      if (cell === undefined || cell.trim() === '') continue
      const v = readNumber(cell, decimalComma)
      if (v === undefined) {
        if (!textInExtra.has(col.header)) {
          textInExtra.add(col.header)
          problems.push({ severity: 'warning', line: rowLine, column: col.header, message: `extra column "${col.header}" holds text ("${cell.trim()}"); only its numbers are kept` })
        }
        continue
      }
      ;(row.extra ??= {})[col.header] = v
    }
    if (row.torque !== undefined && row.power !== undefined) {
      const fromTorque = powerHp(row.torque, rpm)
      const diffPct = fromTorque > 0 ? (Math.abs(row.power - fromTorque) / fromTorque) * 100 : row.power > 0 ? Infinity : 0
      if (diffPct > MAX_DISAGREEMENT_PCT) {
        problems.push({
          severity: 'warning',
          line: rowLine,
          message: `torque and power disagree by ${Number.isFinite(diffPct) ? diffPct.toFixed(1) : 'more than 100'} % at ${rpm} rpm (one column may have been corrected and the other not)`,
          code: DISAGREEMENT_CODE,
          value: Number.isFinite(diffPct) ? diffPct : 100,
          rpm,
        })
      }
    }
    rows.push(row)
  }

  // ---- order, duplicates ----
  let up = 0
  let down = 0
  let firstBreak: { line: number, from: number, to: number } | undefined
  for (let i = 1; i < rows.length; i++) {
    const a = rows[i - 1]
    const b = rows[i]
    if (!a || !b) continue
    if (b.rpm > a.rpm) up++
    if (b.rpm < a.rpm) down++
    if (up > 0 && down > 0 && !firstBreak) firstBreak = { line: b.line, from: a.rpm, to: b.rpm }
  }
  const order: ParsedPull['order'] = up > 0 && down > 0 ? 'mixed' : down > 0 ? 'descending' : 'ascending'
  if (firstBreak) {
    problems.push({
      severity: 'warning',
      line: firstBreak.line,
      message: `rows change direction here (${firstBreak.from} to ${firstBreak.to} rpm): more than one sweep in one file? The rows are sorted by rpm`,
    })
  }
  const sorted = rows.map((r, i) => ({ r, i })).sort((a, b) => a.r.rpm - b.r.rpm || a.i - b.i).map(x => x.r)

  const groups: Row[][] = []
  for (const r of sorted) {
    const g = groups[groups.length - 1]
    const head = g?.[0]
    if (g && head && head.rpm === r.rpm) {
      g.push(r)
      problems.push({ severity: 'warning', line: r.line, message: `${r.rpm} rpm appears again (first at line ${head.line}); the rows are averaged` })
    }
    else groups.push([r])
  }

  const avg = (g: Row[], pick: (r: Row) => number | undefined): number | undefined => {
    const vs = g.map(pick)
    if (vs.some(v => v === undefined)) return undefined
    return (vs as number[]).reduce((a, b) => a + b, 0) / vs.length
  }
  const lines: number[] = []
  const points: PullPoint[] = groups.map((g) => {
    const head = g[0] as Row
    const torque = avg(g, r => r.torque)
    const power = avg(g, r => r.power)
    const p: PullPoint = {
      rpm: head.rpm,
      torqueLbFt: torque ?? torqueLbFt(power ?? 0, head.rpm),
      powerHp: power ?? powerHp(torque ?? 0, head.rpm),
    }
    const vacuum = avg(g, r => r.vacuum)
    if (vacuum !== undefined) p.vacuumInHg = vacuum
    const afrAvg = avg(g, r => r.afr)
    if (afrAvg !== undefined) p.afr = afrAvg
    const extraNames = new Set(g.flatMap(r => Object.keys(r.extra ?? {})))
    for (const name of extraNames) {
      const vs = g.map(r => r.extra?.[name]).filter((v): v is number => v !== undefined)
      ;(p.extra ??= {})[name] = vs.reduce((a, b) => a + b, 0) / vs.length
    }
    lines.push(head.line)
    return p
  })

  // ---- coverage, gaps, spikes ----
  const first = points[0]
  const last = points[points.length - 1]
  if (points.length < MIN_POINTS) {
    problems.push({ severity: 'error', message: `only ${points.length} usable rows; a pull needs at least ${MIN_POINTS}` })
  }
  if (first && last && last.rpm - first.rpm < MIN_SPAN_RPM) {
    problems.push({ severity: 'error', message: `the pull covers only ${first.rpm} to ${last.rpm} rpm; it needs at least ${MIN_SPAN_RPM} rpm` })
  }
  for (let i = 1; i < points.length; i++) {
    const a = points[i - 1]
    const b = points[i]
    if (a && b && b.rpm - a.rpm > MAX_GAP_RPM) {
      problems.push({ severity: 'warning', line: lines[i], message: `gap of ${b.rpm - a.rpm} rpm between ${a.rpm} and ${b.rpm} rpm` })
    }
  }
  // A spike: a point far off the line through its two neighbours while those two agree
  // with each other better than with it. Checked on torque (power follows from it, or
  // is checked against it above). End points have one neighbour and are not judged.
  for (let i = 1; i < points.length - 1; i++) {
    const a = points[i - 1]
    const p = points[i]
    const b = points[i + 1]
    if (!a || !p || !b) continue
    const expected = a.torqueLbFt + ((b.torqueLbFt - a.torqueLbFt) * (p.rpm - a.rpm)) / (b.rpm - a.rpm)
    const off = Math.abs(p.torqueLbFt - expected)
    const level = (Math.abs(a.torqueLbFt) + Math.abs(b.torqueLbFt)) / 2
    if (off > (SPIKE_PCT / 100) * level && off > Math.abs(b.torqueLbFt - a.torqueLbFt)) {
      problems.push({
        severity: 'warning',
        line: lines[i],
        message: `spike at ${p.rpm} rpm: torque ${p.torqueLbFt.toFixed(1)} lb-ft against about ${expected.toFixed(1)} either side`,
      })
    }
  }

  return result({ ...base, units, points, decimalComma, order })
}
