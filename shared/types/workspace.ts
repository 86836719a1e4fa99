// The writers' workspace API contract, shared by the server handlers and the page
// forms: here the limits, the small schemas every subject builds on and the 409 bodies;
// each subject has its own file beside this one: bench-tests, build-sheets, setups,
// pulls, pull-imports, operator-links, inbox, analysis-results (DTOs and request
// bodies as zod schemas). Routes and statuses: docs/api/workspace.md. Figures are in
// the unit their name says (In = inches, Cc = cubic centimetres, Deg = crank degrees, InHg, F, Pct).
import { z } from 'zod'
import { CORRECTION_STANDARD_IDS } from '../dyno/correction'
import { COLUMN_ROLES } from '../dyno/csv'
import type { AtRpm, CorrectionStandard, Problem, RpmRange, Weather } from '../dyno/types'

// The dyno shapes these DTOs are made of, for code that reads them.
export type { AtRpm, CorrectionStandard, Problem, RpmRange, Weather }

// ---------- limits (the server enforces them; forms show them) ----------

export const PULL_LIMITS = {
  /** Per file, UTF-8 bytes. */
  maxFileBytes: 5 * 1024 * 1024,
  /** Lines of a file, header and weather lines included. */
  maxRows: 200_000,
  maxFilesPerBatch: 20,
} as const

export const OPERATOR_LINK_LIMITS = {
  minHours: 1,
  maxHours: 14 * 24,
  defaultHours: 48,
  maxFileBytes: PULL_LIMITS.maxFileBytes,
  /** Files one link accepts in all, unless the writer sets fewer. */
  defaultMaxFiles: 100,
  maxMaxFiles: 500,
  /** Rate limit per link: this many files in this many minutes. */
  rateFiles: 30,
  rateMinutes: 10,
} as const

export const MAX_PARTS_PER_SETUP = 20

// ---------- small shared schemas ----------

export const IdSchema = z.coerce.number().int().positive()
export const VersionSchema = z.number({ error: 'The version you read is required' }).int().min(0)
export const CorrectionStandardSchema = z.enum(CORRECTION_STANDARD_IDS)
export const ColumnRoleSchema = z.enum(COLUMN_ROLES)

/** Weather of one pull as stored: total barometric pressure, intake air temperature, relative humidity. */
export const WeatherSchema = z.object({
  baroInHg: z.number({ error: 'Enter the barometric pressure in inHg' }).min(15, 'Barometric pressure below 15 inHg is not plausible').max(32.5, 'Barometric pressure above 32.5 inHg is not plausible'),
  airTempF: z.number({ error: 'Enter the air temperature in F' }).min(-40, 'Air temperature below -40 F is not plausible').max(140, 'Air temperature above 140 F is not plausible'),
  humidityPct: z.number({ error: 'Enter the relative humidity in %' }).min(0, 'Humidity runs from 0 to 100 %').max(100, 'Humidity runs from 0 to 100 %'),
}) satisfies z.ZodType<Weather>

/** Column roles for headers the parser did not recognise, keyed by the header as written. */
export const ColumnMappingSchema = z.record(z.string().max(200), ColumnRoleSchema)
  .refine(m => Object.keys(m).length <= 100, 'At most 100 mapped columns')

/** 409 body (`data`) when the version sent is stale: the row as it is now. */
export interface StaleVersionData<T> { currentVersion: number, current: T }
/** 409 body (`data`) when deleting something that has pulls without ?confirm=true. */
export interface DeleteConfirmData { setups: number, pulls: number, message: string }
