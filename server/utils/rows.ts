// Conversions between MariaDB rows and the workspace DTOs' plain values.

/** The column name of a DTO field: boreIn -> bore_in, displacementL -> displacement_l. */
type ColumnName<S extends string> = S extends `${infer Head}${infer Tail}`
  ? `${Head extends Lowercase<Head> ? Head : `_${Lowercase<Head>}`}${ColumnName<Tail>}`
  : S

/** A table's row typed from the DTO it becomes: the same fields under their column names and types. */
export type RowOf<T> = { [K in keyof T & string as ColumnName<K>]: T[K] }

/** ISO 8601 for a timestamp column (mysql2 gives Date objects; strings are tolerated). */
export function isoTime(value: Date | string | null | undefined): string | null {
  if (value === null || value === undefined) return null
  const date = value instanceof Date ? value : new Date(value)
  return Number.isNaN(date.getTime()) ? null : date.toISOString()
}

export function isoTimeRequired(value: Date | string): string {
  return isoTime(value) ?? new Date(0).toISOString()
}

/** YYYY-MM-DD for a DATE column. The pool runs in UTC, so the UTC date is the stored date. */
export function isoDay(value: Date | string | null | undefined): string | null {
  if (value === null || value === undefined) return null
  if (typeof value === 'string') return value.slice(0, 10)
  return Number.isNaN(value.getTime()) ? null : value.toISOString().slice(0, 10)
}

/** MariaDB JSON is LONGTEXT: a damaged or missing value gives the fallback, never a crash. */
export function parseJsonColumn<T>(raw: unknown, fallback: T): T {
  if (raw === null || raw === undefined) return fallback
  if (typeof raw !== 'string') return raw as T
  try { return JSON.parse(raw) as T }
  catch { return fallback }
}

export const asBool = (v: unknown): boolean => v === true || v === 1 || v === '1'
export const asNumber = (v: unknown): number => Number(v)
export const asNumberOrNull = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v))
