// Turning what a form input holds into what a zod schema expects. An empty box is
// "not given" (undefined or null), never 0; text that is not a number stays NaN so
// the schema's "Enter ... as a number" message shows.

export function formNumber(value: string | number | null | undefined): number | undefined {
  if (typeof value === 'number') return value
  const t = (value ?? '').trim()
  return t === '' ? undefined : Number(t)
}

export function formNullableNumber(value: string | number | null | undefined): number | null {
  return formNumber(value) ?? null
}

export function formNullableDate(value: string | null | undefined): string | null {
  const t = (value ?? '').trim()
  return t === '' ? null : t
}
