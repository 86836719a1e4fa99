// Figures as the workspace prints them: reported values rounded half away from
// zero (reportRound), thousands separated, one fixed locale so the server render
// and the browser print the same text.
import { reportRound } from '../dyno/round'

export function formatReported(value: number | null | undefined, decimals = 0): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–'
  return reportRound(value, decimals).toLocaleString('en-US', { minimumFractionDigits: decimals, maximumFractionDigits: decimals })
}

/** A gain with its sign: "+12.4", "-3.0", "0.0". */
export function formatSigned(value: number | null | undefined, decimals = 1): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '–'
  const rounded = reportRound(value, decimals)
  const text = formatReported(Math.abs(rounded), decimals)
  return rounded > 0 ? `+${text}` : rounded < 0 ? `-${text}` : text
}

export function formatRpm(rpm: number | null | undefined): string {
  return formatReported(rpm, 0)
}

/** A number and its unit that never break apart on a narrow screen: "+13.4\u00a0lb-ft". */
export function withUnitNbsp(number: string, unit: string): string {
  return unit === '%' ? `${number}%` : `${number}\u00a0${unit}`
}
