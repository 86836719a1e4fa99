// Rounding for reported figures: to nearest, ties away from zero (common practice),
// decided on the number's shortest decimal form. Math.round(x * 100) / 100 gets
// 1.005 wrong because 1.005 * 100 is 100.49999999999999 in binary; the decimal
// string "1.005" has the tie the writer typed and the reader expects.

const MAX_DECIMALS = 15

/** Round to `decimals` places, half away from zero, exact on decimal ties (1.005 -> 1.01, 487.5 -> 488). */
export function reportRound(value: number, decimals = 0): number {
  if (!Number.isInteger(decimals) || decimals < 0 || decimals > MAX_DECIMALS) {
    throw new RangeError(`decimals must be a whole number from 0 to ${MAX_DECIMALS} (got ${decimals})`)
  }
  if (!Number.isFinite(value)) return value
  const negative = value < 0
  // String() gives the shortest decimal that round-trips, maybe in exponent form.
  const [mantissa = '0', exponent] = String(Math.abs(value)).split('e')
  const [intPart = '0', fracPart = ''] = mantissa.split('.')
  let digits = intPart + fracPart
  let pointAt = intPart.length + (exponent ? Number(exponent) : 0)
  if (pointAt < 0) {
    digits = '0'.repeat(-pointAt) + digits
    pointAt = 0
  }
  const keep = pointAt + decimals
  if (digits.length <= keep) return value
  let kept = BigInt(digits.slice(0, keep) || '0')
  if ((digits[keep] ?? '0') >= '5') kept += BigInt(1) // not a 1n literal: the server bundle targets es2019
  const rounded = Number(`${kept}e-${decimals}`)
  return negative && rounded !== 0 ? -rounded : rounded
}

/** reportRound as a string with exactly `decimals` places ("2.0"), for text and tables. */
export function reportFixed(value: number, decimals = 0): string {
  const r = reportRound(value, decimals)
  return Number.isFinite(r) ? r.toFixed(decimals) : String(r)
}
