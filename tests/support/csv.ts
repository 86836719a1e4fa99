import Papa from 'papaparse'

/** A CSV's rows as the reference parser reads them (RFC 4180), blank lines left out. */
export function csvRows(text: string): string[][] {
  const parsed = Papa.parse<string[]>(text, { skipEmptyLines: 'greedy' })
  if (parsed.errors.length) throw new Error(`CSV: ${parsed.errors.map(e => `row ${e.row}: ${e.message}`).join('; ')}`)
  return parsed.data
}
