// The data check of one pull file, before anything is saved: the limits and file-level
// refusals (empty, too big, binary, garbage), then shared/dyno's parser, shaped into
// the preview the import page shows. Pure; used by the import, the inbox and the seed.
import { assertWeather, correctionProblems, downsampleForDisplay, parsePullCsv, peakOf, type ColumnRole, type CorrectionStandard, type ParsedPull, type Problem, type Weather } from '../../../shared/dyno/index'
import type { PullFilePreview } from '../../../shared/types/pull-imports'
import type { ImportProblem } from '../../../shared/types/pulls'
import { PULL_LIMITS } from '../../../shared/types/workspace'

export interface CheckedPullFile {
  name: string
  text: string
  bytes: number
  rowCount: number
  /** null when the file was refused before parsing. */
  parsed: ParsedPull | null
  preview: PullFilePreview
}

/** Problems kept per file: a garbage file of 200,000 rows would otherwise answer with 200,000. */
export const MAX_PROBLEMS_PER_FILE = 100
const PREVIEW_POINTS = 120

export function problemText(file: string, p: Problem): string {
  const where = [file, p.line !== undefined ? `line ${p.line}` : '', p.column ? `column "${p.column}"` : ''].filter(Boolean).join(', ')
  return `${where}: ${p.message}`
}

export function toImportProblem(file: string, p: Problem): ImportProblem {
  return { ...p, file, text: problemText(file, p) }
}

/** At most `max` problems, errors first, and one line saying how many more there were. */
export function capProblems(problems: readonly Problem[], max = MAX_PROBLEMS_PER_FILE): Problem[] {
  if (problems.length <= max) return [...problems]
  const errors = problems.filter(p => p.severity === 'error')
  const warnings = problems.filter(p => p.severity !== 'error')
  const kept = [...errors, ...warnings].slice(0, max - 1)
  const left = problems.length - kept.length
  const severity = errors.length > kept.filter(p => p.severity === 'error').length ? 'error' : 'warning'
  return [...kept, { severity, message: `and ${left} more problem${left === 1 ? '' : 's'} like these` }]
}

/** Lines of a text: \r\n, \r and \n each end one; a last line without a break counts. */
export function countLines(text: string): number {
  if (text.length === 0) return 0
  let n = 0
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i)
    if (c === 10) n++
    else if (c === 13 && text.charCodeAt(i + 1) !== 10) n++
  }
  const last = text.charCodeAt(text.length - 1)
  return last === 10 || last === 13 ? n : n + 1
}

function lineOf(text: string, index: number): number {
  return countLines(text.slice(0, index + 1))
}

/** Uploaded bytes as text. Bytes that are not UTF-8 become U+FFFD, which the check then refuses naming the line. */
export function decodeUploadedBytes(bytes: Uint8Array): string {
  return new TextDecoder('utf-8', { fatal: false }).decode(bytes)
}

function mb(bytes: number): string {
  return `${(bytes / 1024 / 1024).toFixed(1)} MB`
}

/** File-level refusals; an empty list means the text may go to the parser. */
function fileLevelProblems(text: string, bytes: number, rows: number): Problem[] {
  if (bytes === 0 || text.trim() === '') return [{ severity: 'error', message: 'the file is empty' }]
  if (bytes > PULL_LIMITS.maxFileBytes) {
    return [{ severity: 'error', message: `the file is ${mb(bytes)}; files up to ${mb(PULL_LIMITS.maxFileBytes)} are accepted` }]
  }
  if (rows > PULL_LIMITS.maxRows) {
    return [{ severity: 'error', message: `the file has ${rows.toLocaleString('en-US')} lines; up to ${PULL_LIMITS.maxRows.toLocaleString('en-US')} are accepted` }]
  }
  const nul = text.indexOf('\u0000')
  if (nul >= 0) {
    return [{ severity: 'error', line: lineOf(text, nul), message: 'the file holds NUL bytes: it is a binary file, not CSV text (export the pull as CSV)' }]
  }
  const bad = text.indexOf('\uFFFD')
  if (bad >= 0) {
    return [{ severity: 'error', line: lineOf(text, bad), message: 'the file is not UTF-8 text (bytes here cannot be read as characters); save it as UTF-8 CSV' }]
  }
  return []
}

const norm = (s: string): string => s.toLowerCase().replace(/\s+/g, ' ').trim()

/** Problems only this layer can see: a useless header row, a mapping that went wrong. */
function mappingProblems(parsed: ParsedPull, mapping: Record<string, ColumnRole> | undefined): Problem[] {
  const problems: Problem[] = []
  const line = parsed.headerLine
  const named = parsed.columns.filter(c => c.header !== '')
  const usable = named.filter(c => c.role !== 'extra' && c.role !== 'ignore')
  if (named.length > 0 && usable.length === 0) {
    problems.push({ severity: 'error', line, message: `none of the columns (${named.slice(0, 8).map(c => `"${c.header}"`).join(', ')}${named.length > 8 ? ' ...' : ''}) is one Pullsheet reads: map them to rpm, torque or power` })
  }
  if (mapping && Object.keys(mapping).length > 0) {
    const headers = new Set(named.map(c => norm(c.header)))
    for (const header of Object.keys(mapping)) {
      if (!headers.has(norm(header))) problems.push({ severity: 'warning', line, column: header, message: `the mapping names column "${header}", which the file does not have` })
    }
    if (!parsed.columns.some(c => c.role === 'rpm')) {
      problems.push({ severity: 'error', line, message: 'the column mapping leaves no rpm column: map one column to rpm' })
    }
  }
  return problems
}

function emptyPreview(name: string, bytes: number, rowCount: number): PullFilePreview {
  return { name, ok: false, sizeBytes: bytes, rowCount, pointCount: 0, rpmFrom: null, rpmTo: null, units: {}, columns: [], unrecognisedHeaders: [], weather: null, peakPower: null, peakTorque: null, curve: [], problems: [] }
}

export function checkPullFile(input: { name: string, text: string, bytes?: number, mapping?: Record<string, ColumnRole> }): CheckedPullFile {
  const { name, text, mapping } = input
  const bytes = input.bytes ?? Buffer.byteLength(text, 'utf8')
  const rowCount = countLines(text)
  const refused = fileLevelProblems(text, bytes, rowCount)
  if (refused.length) {
    const preview = emptyPreview(name, bytes, rowCount)
    preview.problems = refused.map(p => toImportProblem(name, p))
    return { name, text, bytes, rowCount, parsed: null, preview }
  }

  const parsed = parsePullCsv(text, mapping ? { columns: mapping } : {})
  const problems = [...mappingProblems(parsed, mapping), ...parsed.problems]
  const mapped = new Set(Object.keys(mapping ?? {}).map(norm))
  const first = parsed.points[0]
  const last = parsed.points[parsed.points.length - 1]
  const preview: PullFilePreview = {
    name,
    ok: !problems.some(p => p.severity === 'error'),
    sizeBytes: bytes,
    rowCount,
    pointCount: parsed.points.length,
    rpmFrom: first?.rpm ?? null,
    rpmTo: last?.rpm ?? null,
    units: parsed.units,
    columns: parsed.columns,
    unrecognisedHeaders: parsed.columns.filter(c => c.header !== '' && (c.role === 'extra' || c.role === 'ignore') && !mapped.has(norm(c.header))).map(c => c.header),
    weather: parsed.weather ?? null,
    peakPower: first ? peakOf(parsed.points, 'powerHp') : null,
    peakTorque: first ? peakOf(parsed.points, 'torqueLbFt') : null,
    curve: parsed.points.length >= 2
      ? downsampleForDisplay(parsed.points, PREVIEW_POINTS).map(p => ({ rpm: p.rpm, torqueLbFt: p.torqueLbFt, powerHp: p.powerHp }))
      : [],
    problems: capProblems(problems).map(p => toImportProblem(name, p)),
  }
  parsed.ok = preview.ok
  return { name, text, bytes, rowCount, parsed, preview }
}

/**
 * The weather a pull is saved with: impossible weather is an error naming the file;
 * a correction factor far from 1 under the bench test's standard is a warning kept with the pull.
 */
export function weatherProblems(file: string, weather: Weather | null, dynoCorrected: boolean, standard: CorrectionStandard): ImportProblem[] {
  if (!weather) {
    return dynoCorrected ? [] : [toImportProblem(file, { severity: 'error', message: 'the weather of the pull is missing (enter it, or mark the pull as corrected by the dyno)' })]
  }
  try { assertWeather(weather) }
  catch (e) { return [toImportProblem(file, { severity: 'error', message: `weather: ${(e as Error).message}` })] }
  return dynoCorrected ? [] : correctionProblems(standard, weather).map(p => toImportProblem(file, p))
}
