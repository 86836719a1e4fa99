// Rounding for reported figures: to nearest, ties away from zero (common practice),
// decided on the number's shortest decimal form. Math.round(x * 100) / 100 gets
// 1.005 wrong because 1.005 * 100 is 100.49999999999999 in binary; the decimal
// string "1.005" has the tie the writer typed and the reader expects.

const MAX_DECIMALS = 15

// A difference of two decimal figures carries binary noise: 16.0 - 19.15 is
// -3.1499999999999986, whose shortest form hides the tie of -3.15 (issue 15 item 8).
// The value is first taken to 9 decimals, far below anything a dyno measures and far
// above the noise of doubles at these magnitudes (about 1e-12 at 10,000), so the tie
// the figures really make is the one rounded.
const NOISE_DECIMALS = 9
const NOISE_LIMIT = 1e9

function withoutBinaryNoise(value: number, decimals: number): number {
  return decimals < NOISE_DECIMALS && Math.abs(value) < NOISE_LIMIT ? Number(value.toFixed(NOISE_DECIMALS)) : value
}

/** Round to `decimals` places, half away from zero, exact on decimal ties (1.005 -> 1.01, 487.5 -> 488). */
export function reportRound(value: number, decimals = 0): number {
  if (!Number.isInteger(decimals) || decimals < 0 || decimals > MAX_DECIMALS) {
    throw new RangeError(`decimals must be a whole number from 0 to ${MAX_DECIMALS} (got ${decimals})`)
  }
  if (!Number.isFinite(value)) return value
  value = withoutBinaryNoise(value, decimals)
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
