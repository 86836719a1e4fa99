// Writing tables as CSV (RFC 4180 quoting, CRLF line ends). Text cells that a
// spreadsheet would run as a formula (starting with = + - @, or a tab or carriage
// return) get a leading apostrophe, the usual guard against formula injection.
// Number cells are written as numbers: -2.8 is a loss, not a formula.

export type CsvCell = string | number | null | undefined

const FORMULA_START = /^[=+\-@\t\r]/

export function csvCell(cell: CsvCell, delimiter = ','): string {
  if (cell === null || cell === undefined) return ''
  if (typeof cell === 'number') return Number.isFinite(cell) ? String(cell) : ''
  const text = FORMULA_START.test(cell) ? `'${cell}` : cell
  const needsQuotes = text.includes(delimiter) || /["\r\n]/.test(text) || text !== text.trim()
  return needsQuotes ? `"${text.replaceAll('"', '""')}"` : text
}

export function writeCsv(rows: readonly (readonly CsvCell[])[], opts: { delimiter?: ',' | ';' | '\t' } = {}): string {
  const delimiter = opts.delimiter ?? ','
  return rows.map(row => row.map(c => csvCell(c, delimiter)).join(delimiter)).join('\r\n') + '\r\n'
}
