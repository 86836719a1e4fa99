// The writers' workspace API contract: every DTO the pages read and every request
// body as a zod schema, shared by the server handlers and the page forms.
// Routes and statuses: docs/api/workspace.md. Figures are in the unit their name
// says (In = inches, Cc = cubic centimetres, Deg = crank degrees, InHg, F, Pct).
import { z } from 'zod'
import type { EngineFamily, PartType } from './catalog'
import { ANALYSIS_UNITS, type AnalysisUnits } from './analysis'
import { EngineFamilySchema, PartTypeSchema } from './catalog-schemas'
import { CORRECTION_STANDARD_IDS } from '../dyno/correction'
import { COLUMN_ROLES, type ColumnRole } from '../dyno/csv'
import type { AtRpm, CorrectionStandard, PowerUnit, Problem, RpmRange, TorqueUnit, VacuumUnit, Weather } from '../dyno/types'

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
const IsoDate = z.iso.date({ error: 'Use a date like 2026-05-14' })
const text = (max: number, label = 'this') => z.string().trim().max(max, `Keep ${label} under ${max} characters`)
const positive = (label: string, max: number) => z.number({ error: `Enter ${label} as a number` }).positive(`${label} must be above 0`).max(max, `${label} above ${max} is not plausible`)

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

// ---------- bench tests ----------

export interface BenchTest {
  id: number
  slug: string
  title: string
  engineFamily: EngineFamily
  partType: PartType
  shop: string
  dyno: string
  /** YYYY-MM-DD */
  testedFrom: string | null
  testedTo: string | null
  notes: string
  ownerId: number
  ownerName: string
  defaultStandard: CorrectionStandard
  version: number
  createdAt: string
  updatedAt: string
  deletedAt: string | null
}

/** A row of the bench test list. */
export interface BenchTestSummary extends Omit<BenchTest, 'notes'> {
  setupCount: number
  pullCount: number
  inboxWaiting: number
}

const benchTestFields = {
  title: z.string().trim().min(1, 'Enter a title').max(200, 'Keep the title under 200 characters'),
  engineFamily: EngineFamilySchema,
  partType: PartTypeSchema,
  shop: text(200, 'the shop'),
  dyno: text(200, 'the dyno'),
  testedFrom: IsoDate.nullable(),
  testedTo: IsoDate.nullable(),
  notes: text(20_000, 'the notes'),
  defaultStandard: CorrectionStandardSchema,
}

function datesInOrder(b: { testedFrom?: string | null, testedTo?: string | null }): boolean {
  return !b.testedFrom || !b.testedTo || b.testedFrom <= b.testedTo
}
const DATES_ORDER = { message: 'The last test day comes after the first', path: ['testedTo'] }

/** POST /api/bench-tests. Omitted text fields are empty, dates null, standard SAE J1349 (JUN1990). */
export const CreateBenchTestBody = z.object({
  title: benchTestFields.title,
  engineFamily: benchTestFields.engineFamily,
  partType: benchTestFields.partType,
  shop: benchTestFields.shop.optional(),
  dyno: benchTestFields.dyno.optional(),
  testedFrom: benchTestFields.testedFrom.optional(),
  testedTo: benchTestFields.testedTo.optional(),
  notes: benchTestFields.notes.optional(),
  defaultStandard: benchTestFields.defaultStandard.optional(),
}).refine(datesInOrder, DATES_ORDER)
export type CreateBenchTestInput = z.infer<typeof CreateBenchTestBody>

/** PATCH /api/bench-tests/:id: any fields, with the version read. */
export const UpdateBenchTestBody = z.object({
  version: VersionSchema,
  title: benchTestFields.title.optional(),
  engineFamily: benchTestFields.engineFamily.optional(),
  partType: benchTestFields.partType.optional(),
  shop: benchTestFields.shop.optional(),
  dyno: benchTestFields.dyno.optional(),
  testedFrom: benchTestFields.testedFrom.optional(),
  testedTo: benchTestFields.testedTo.optional(),
  notes: benchTestFields.notes.optional(),
  defaultStandard: benchTestFields.defaultStandard.optional(),
}).refine(datesInOrder, DATES_ORDER)
export type UpdateBenchTestInput = z.infer<typeof UpdateBenchTestBody>

export const BenchTestListQuery = z.object({
  /** 'only': the deleted ones (to restore); otherwise deleted ones are left out. */
  deleted: z.enum(['only']).optional(),
  q: z.string().trim().max(100).optional(),
})

/** ?confirm=true on DELETE of a bench test or setup that has pulls. */
export const ConfirmQuery = z.object({ confirm: z.enum(['true', 'false']).optional() })

// ---------- build sheet ----------

export interface BuildSheet {
  benchTestId: number
  boreIn: number
  strokeIn: number
  cylinders: number
  /** pi/4 x bore^2 x stroke x cylinders (shared/dyno displacementCi). */
  displacementCi: number
  displacementL: number
  compressionRatio: number | null
  heads: string
  induction: string
  fuel: string
  ignition: string
  exhaust: string
  notes: string
  version: number
  updatedAt: string
}

/** PUT /api/bench-tests/:id/build-sheet. version 0 when none exists yet. */
export const BuildSheetBody = z.object({
  version: VersionSchema,
  boreIn: positive('Bore (in)', 10),
  strokeIn: positive('Stroke (in)', 10),
  cylinders: z.number({ error: 'Enter the number of cylinders' }).int('Cylinders is a whole number').min(1, 'At least 1 cylinder').max(16, 'At most 16 cylinders'),
  compressionRatio: z.number({ error: 'Enter the ratio as a number, e.g. 10.5' }).min(5, 'A compression ratio below 5:1 is not plausible').max(20, 'A compression ratio above 20:1 is not plausible').nullable(),
  heads: text(500, 'the heads'),
  induction: text(500, 'the induction'),
  fuel: text(200, 'the fuel'),
  ignition: text(500, 'the ignition'),
  exhaust: text(500, 'the exhaust'),
  notes: text(10_000, 'the notes'),
})
export type BuildSheetInput = z.infer<typeof BuildSheetBody>

// ---------- setups and part specs ----------

export const PART_CATEGORIES = [
  { id: 'camshaft', label: 'Camshaft' },
  { id: 'intake-manifold', label: 'Intake manifold' },
  { id: 'carburetor', label: 'Carburetor' },
  { id: 'throttle-body', label: 'Throttle body' },
  { id: 'headers', label: 'Headers and exhaust manifolds' },
  { id: 'cylinder-heads', label: 'Cylinder heads' },
  { id: 'ignition-timing', label: 'Ignition timing' },
  { id: 'other', label: 'Other' },
] as const
export type PartCategory = typeof PART_CATEGORIES[number]['id']

export const INTAKE_MANIFOLD_TYPES = [
  { id: 'dual-plane', label: 'Dual-plane' },
  { id: 'single-plane', label: 'Single-plane' },
  { id: 'tunnel-ram', label: 'Tunnel ram' },
  { id: 'efi', label: 'EFI' },
] as const
export type IntakeManifoldType = typeof INTAKE_MANIFOLD_TYPES[number]['id']

export const EXHAUST_STYLES = [
  { id: 'cast-manifold', label: 'Cast manifold' },
  { id: 'shorty', label: 'Shorty headers' },
  { id: 'mid-length', label: 'Mid-length headers' },
  { id: 'long-tube', label: 'Long-tube headers' },
] as const
export type ExhaustStyle = typeof EXHAUST_STYLES[number]['id']

const ids = <T extends readonly { id: string }[]>(list: T) => list.map(i => i.id) as [T[number]['id'], ...T[number]['id'][]]

/** Fields every part card has: who makes it and what it is called (invented in demo data). */
const partCommon = {
  maker: text(120, 'the maker').optional(),
  model: text(160, 'the part name').optional(),
  notes: text(2000, 'the notes').optional(),
}
const degrees = (label: string) => z.number({ error: `Enter ${label} in degrees` }).positive(`${label} must be above 0`).max(400, `${label} above 400 degrees is not plausible`)
const liftIn = (label: string) => z.number({ error: `Enter ${label} in inches` }).positive(`${label} must be above 0`).max(1.5, `${label} above 1.5 in is not plausible`)

/** A cam card: durations in crank degrees, lifts in inches at the valve. */
export const CamshaftSpec = z.object({
  category: z.literal('camshaft'),
  ...partCommon,
  intakeDuration050Deg: degrees('Intake duration at 0.050 in'),
  exhaustDuration050Deg: degrees('Exhaust duration at 0.050 in'),
  intakeAdvertisedDeg: degrees('Intake advertised duration').optional(),
  exhaustAdvertisedDeg: degrees('Exhaust advertised duration').optional(),
  intakeLiftIn: liftIn('Intake lift'),
  exhaustLiftIn: liftIn('Exhaust lift'),
  lsaDeg: z.number({ error: 'Enter the lobe separation angle in degrees' }).min(95, 'A lobe separation below 95 degrees is not plausible').max(130, 'A lobe separation above 130 degrees is not plausible'),
  iclDeg: z.number({ error: 'Enter the intake centerline in degrees' }).min(90, 'An intake centerline below 90 degrees is not plausible').max(130, 'An intake centerline above 130 degrees is not plausible'),
}).refine(c => c.intakeAdvertisedDeg === undefined || c.intakeAdvertisedDeg > c.intakeDuration050Deg, { message: 'Advertised duration is longer than duration at 0.050 in', path: ['intakeAdvertisedDeg'] })
  .refine(c => c.exhaustAdvertisedDeg === undefined || c.exhaustAdvertisedDeg > c.exhaustDuration050Deg, { message: 'Advertised duration is longer than duration at 0.050 in', path: ['exhaustAdvertisedDeg'] })

export const IntakeManifoldSpec = z.object({
  category: z.literal('intake-manifold'),
  ...partCommon,
  type: z.enum(ids(INTAKE_MANIFOLD_TYPES), { error: 'Choose the manifold type' }),
  runnerNotes: text(1000, 'the runner notes').optional(),
  plenumNotes: text(1000, 'the plenum notes').optional(),
})

export const CarburetorSpec = z.object({
  category: z.literal('carburetor'),
  ...partCommon,
  airflowCfm: positive('Airflow (cfm)', 3000),
})

export const ThrottleBodySpec = z.object({
  category: z.literal('throttle-body'),
  ...partCommon,
  boreMm: positive('Bore (mm)', 200),
  bores: z.number().int().min(1).max(16).optional(),
})

/** Headers need their primary tube and collector; a cast manifold may leave them out. */
export const HeadersSpec = z.object({
  category: z.literal('headers'),
  ...partCommon,
  style: z.enum(ids(EXHAUST_STYLES), { error: 'Choose the style' }),
  primaryDiameterIn: positive('Primary diameter (in)', 5).optional(),
  primaryLengthIn: positive('Primary length (in)', 120).optional(),
  collectorDiameterIn: positive('Collector diameter (in)', 8).optional(),
}).refine(h => h.style === 'cast-manifold' || h.primaryDiameterIn !== undefined, { message: 'Enter the primary tube diameter', path: ['primaryDiameterIn'] })
  .refine(h => h.style === 'cast-manifold' || h.primaryLengthIn !== undefined, { message: 'Enter the primary tube length', path: ['primaryLengthIn'] })
  .refine(h => h.style === 'cast-manifold' || h.collectorDiameterIn !== undefined, { message: 'Enter the collector diameter', path: ['collectorDiameterIn'] })

export const CylinderHeadsSpec = z.object({
  category: z.literal('cylinder-heads'),
  ...partCommon,
  intakePortCc: positive('Intake port volume (cc)', 600),
  exhaustPortCc: positive('Exhaust port volume (cc)', 400).optional(),
  chamberCc: positive('Chamber volume (cc)', 200).optional(),
  intakeValveIn: positive('Intake valve (in)', 3),
  exhaustValveIn: positive('Exhaust valve (in)', 3),
})

export const IgnitionTimingSpec = z.object({
  category: z.literal('ignition-timing'),
  ...partCommon,
  totalAdvanceDeg: z.number({ error: 'Enter the total advance in degrees' }).min(-10, 'Total advance below -10 degrees is not plausible').max(60, 'Total advance above 60 degrees is not plausible'),
  initialAdvanceDeg: z.number().min(-10).max(40).optional(),
  allInByRpm: z.number().int().positive().max(20_000).optional(),
})

export const OtherPartSpec = z.object({
  category: z.literal('other'),
  ...partCommon,
  title: z.string().trim().min(1, 'Say what the part is').max(160, 'Keep the title under 160 characters'),
  details: text(4000, 'the details').optional(),
})

/** One part card of a setup, validated by its category. */
export const PartSpecSchema = z.discriminatedUnion('category', [
  CamshaftSpec, IntakeManifoldSpec, CarburetorSpec, ThrottleBodySpec, HeadersSpec, CylinderHeadsSpec, IgnitionTimingSpec, OtherPartSpec,
])
export type PartSpec = z.infer<typeof PartSpecSchema>
export const PartsSchema = z.array(PartSpecSchema).max(MAX_PARTS_PER_SETUP, `At most ${MAX_PARTS_PER_SETUP} parts per setup`)

export interface IdleCheck {
  id: number
  setupId: number
  idleRpm: number
  vacuumInHg: number
  note: string
  createdAt: string
}

export interface Setup {
  id: number
  benchTestId: number
  position: number
  isBaseline: boolean
  label: string
  description: string
  parts: PartSpec[]
  idleChecks: IdleCheck[]
  /** Mean of the idle checks, inHg; null without any. */
  idleVacuumInHg: number | null
  pullCount: number
  includedPullCount: number
  version: number
  updatedAt: string
  deletedAt: string | null
}

/** POST /api/bench-tests/:id/setups. The first setup of a bench test is its baseline. */
export const CreateSetupBody = z.object({
  label: z.string().trim().min(1, 'Name the setup').max(120, 'Keep the name under 120 characters'),
  description: text(4000, 'the description').optional(),
  parts: PartsSchema.optional(),
  baseline: z.boolean().optional(),
})
export type CreateSetupInput = z.infer<typeof CreateSetupBody>

/** PATCH /api/bench-tests/:id/setups/:setupId. parts replaces the whole list. */
export const UpdateSetupBody = z.object({
  version: VersionSchema,
  label: CreateSetupBody.shape.label.optional(),
  description: text(4000, 'the description').optional(),
  parts: PartsSchema.optional(),
})
export type UpdateSetupInput = z.infer<typeof UpdateSetupBody>

/** PUT /api/bench-tests/:id/setups/order: every live setup id once, in the new order. */
export const SetupOrderBody = z.object({ setupIds: z.array(z.number().int().positive()).min(1).max(200) })

/** POST /api/bench-tests/:id/setups/:setupId/idle-checks */
export const IdleCheckBody = z.object({
  idleRpm: z.number({ error: 'Enter the idle speed in rpm' }).int('Idle speed is a whole number').min(300, 'Idle below 300 rpm is not plausible').max(3000, 'Idle above 3000 rpm is not plausible'),
  vacuumInHg: z.number({ error: 'Enter the manifold vacuum in inHg' }).min(0, 'Vacuum is 0 inHg or more').max(30, 'Vacuum above 30 inHg is not plausible'),
  note: text(500, 'the note').optional(),
})
export type IdleCheckInput = z.infer<typeof IdleCheckBody>

export interface BenchTestDetail {
  benchTest: BenchTest
  buildSheet: BuildSheet | null
  setups: Setup[]
}

// ---------- pulls ----------

/** A data-check problem of an import, naming its file; `text` is the whole sentence to show. */
export interface ImportProblem extends Problem {
  file: string
  text: string
}

export interface PullSummary {
  id: number
  setupId: number
  /** 1, 2, 3 ... in upload order within the setup. */
  number: number
  fileName: string
  uploadedAt: string
  uploadedBy: { kind: 'user', userId: number, name: string } | { kind: 'operator-link', linkId: number, label: string }
  weather: Weather | null
  dynoCorrected: boolean
  included: boolean
  exclusionReason: string
  rowCount: number
  pointCount: number
  rpmFrom: number
  rpmTo: number
  units: { torque?: TorqueUnit, power?: PowerUnit, vacuum?: VacuumUnit }
  /** Observed peaks, uncorrected. */
  peakPower: AtRpm
  peakTorque: AtRpm
  problems: Problem[]
  version: number
}

/** A point of a stored pull: observed, lb-ft, hp, inHg. */
export interface StoredPoint { rpm: number, torqueLbFt: number, powerHp: number, vacuumInHg?: number, afr?: number }

export interface PullDetail extends PullSummary {
  points: StoredPoint[]
  extraColumns: string[]
}

/** Repeatability of one setup's included pulls, corrected to the bench test's default standard. */
export interface SetupRepeatability {
  setupId: number
  includedPulls: number
  /** Largest spread of power between the pulls, percent; null with fewer than 2 pulls. */
  spreadPct: number | null
  rpmOfLargestSpread: number | null
  /** Needs 3 pulls or more. */
  outlier: { pullId: number, deviationPct: number, beyondRepeatability: boolean } | null
  /** spreadPct within the common-practice limit (REPEATABILITY_PCT of shared/dyno). */
  withinLimit: boolean | null
  /** Why it could not be computed (pulls share no rpm range ...). */
  problem: string | null
}

export interface PullList {
  pulls: PullSummary[]
  repeatability: SetupRepeatability[]
  standard: CorrectionStandard
}

/** PATCH /api/bench-tests/:id/pulls/:pullId. Excluding needs a reason. */
export const UpdatePullBody = z.object({
  version: VersionSchema,
  included: z.boolean().optional(),
  exclusionReason: text(500, 'the reason').optional(),
  weather: WeatherSchema.nullable().optional(),
  dynoCorrected: z.boolean().optional(),
  setupId: z.number().int().positive().optional(),
}).refine(b => b.included !== false || (b.exclusionReason ?? '').length > 0, { message: 'Say why the pull is left out', path: ['exclusionReason'] })
export type UpdatePullInput = z.infer<typeof UpdatePullBody>

// ---------- pull import (two steps) ----------

export const FileNameSchema = z.string().trim().min(1, 'The file needs a name').max(255, 'File names up to 255 characters')

/** A file as read by the browser (File.text()); mapping gives roles to unrecognised headers. */
export const ImportFileSchema = z.object({
  name: FileNameSchema,
  text: z.string(),
  mapping: ColumnMappingSchema.optional(),
})

/** POST /api/bench-tests/:id/pulls/preview: nothing is saved. */
export const PreviewPullsBody = z.object({
  files: z.array(ImportFileSchema).min(1, 'Choose at least one file').max(PULL_LIMITS.maxFilesPerBatch, `At most ${PULL_LIMITS.maxFilesPerBatch} files at once`),
})
export type PreviewPullsInput = z.infer<typeof PreviewPullsBody>

/** Where a file goes and the weather it was pulled in; weather may be null only when the dyno already corrected it. */
export const PullAssignment = z.object({
  setupId: z.number({ error: 'Choose the setup this pull was made with (none is assumed)' }).int().positive(),
  weather: WeatherSchema.nullable(),
  dynoCorrected: z.boolean().optional(),
})
const weatherUnlessCorrected = { message: 'Enter the weather of the pull (or mark it as corrected by the dyno)', path: ['weather'] }

export const CommitFileSchema = ImportFileSchema.extend(PullAssignment.shape)
  .refine(f => f.weather !== null || f.dynoCorrected === true, weatherUnlessCorrected)

/** POST /api/bench-tests/:id/pulls/import: all files saved in one transaction, or none. */
export const CommitPullsBody = z.object({
  files: z.array(CommitFileSchema).min(1, 'Choose at least one file').max(PULL_LIMITS.maxFilesPerBatch, `At most ${PULL_LIMITS.maxFilesPerBatch} files at once`),
})
export type CommitPullsInput = z.infer<typeof CommitPullsBody>

export interface PreviewPoint { rpm: number, torqueLbFt: number, powerHp: number }

export interface PullFilePreview {
  name: string
  /** No error-severity problem: the file may be imported. */
  ok: boolean
  sizeBytes: number
  /** Lines of the file. */
  rowCount: number
  pointCount: number
  rpmFrom: number | null
  rpmTo: number | null
  units: { torque?: TorqueUnit, power?: PowerUnit, vacuum?: VacuumUnit }
  columns: { header: string, role: ColumnRole }[]
  /** Headers read as extra channels or refused for their unit: candidates for the mapping step. */
  unrecognisedHeaders: string[]
  /** Weather lines found in the file (converted to inHg, F, %). */
  weather: Partial<Weather> | null
  peakPower: AtRpm | null
  peakTorque: AtRpm | null
  /** At most 120 points for a small preview graph, observed. */
  curve: PreviewPoint[]
  problems: ImportProblem[]
}

export interface PreviewPullsResponse { files: PullFilePreview[] }
export interface CommitPullsResponse { pulls: PullSummary[] }
/** 422 body (`data`) when a batch is refused: every file's preview with its problems. */
export interface ImportRefusedData { files: PullFilePreview[], problems: ImportProblem[] }

// ---------- operator upload links ----------

export const OPERATOR_LINK_STATES = ['active', 'expired', 'revoked', 'used-up'] as const
export type OperatorLinkState = typeof OPERATOR_LINK_STATES[number]

export interface OperatorLink {
  id: number
  benchTestId: number
  label: string
  createdAt: string
  createdByName: string
  expiresAt: string
  revokedAt: string | null
  maxFiles: number
  maxFileBytes: number
  filesReceived: number
  state: OperatorLinkState
}

/** POST /api/bench-tests/:id/operator-links */
export const CreateOperatorLinkBody = z.object({
  label: text(120, 'the label').optional(),
  expiresInHours: z.number({ error: 'Choose how long the link works' }).int().min(OPERATOR_LINK_LIMITS.minHours, 'At least 1 hour').max(OPERATOR_LINK_LIMITS.maxHours, 'At most 14 days'),
  maxFiles: z.number().int().min(1).max(OPERATOR_LINK_LIMITS.maxMaxFiles).optional(),
})
export type CreateOperatorLinkInput = z.infer<typeof CreateOperatorLinkBody>

/** The only time the token is shown: the link to hand to the operator. */
export interface CreatedOperatorLink { link: OperatorLink, url: string, token: string }

/** GET /api/upload/:token: all the link reveals. */
export interface UploadLinkInfo {
  benchTestTitle: string
  expiresAt: string
  maxFileBytes: number
  filesLeft: number
  rate: { files: number, minutes: number }
}

export interface UploadReceipt {
  /** filedTo: the setup the file became a pull of, during a dyno day (else it waits in the inbox). */
  received: { name: string, sizeBytes: number, ok: boolean, problemCount: number, filedTo?: string }[]
  filesLeft: number
}

// ---------- inbox ----------

export const INBOX_STATES = ['waiting', 'assigned', 'dismissed'] as const
export type InboxState = typeof INBOX_STATES[number]

export interface InboxFile {
  id: number
  benchTestId: number
  fileName: string
  sizeBytes: number
  receivedAt: string
  link: { id: number, label: string }
  state: InboxState
  assignedPullId: number | null
  preview: PullFilePreview
}

export const InboxListQuery = z.object({ state: z.enum(INBOX_STATES).optional() })

/** POST /api/bench-tests/:id/inbox/assign: every item in one transaction, through the import path. */
export const AssignInboxBody = z.object({
  items: z.array(PullAssignment.extend({
    fileId: z.number().int().positive(),
    mapping: ColumnMappingSchema.optional(),
  }).refine(f => f.weather !== null || f.dynoCorrected === true, weatherUnlessCorrected)).min(1).max(PULL_LIMITS.maxFilesPerBatch),
})
export type AssignInboxInput = z.infer<typeof AssignInboxBody>

/** POST /api/bench-tests/:id/inbox/:fileId/preview: the stored file parsed again with a mapping. */
export const InboxPreviewBody = z.object({ mapping: ColumnMappingSchema.optional() })

// ---------- analysis ----------

const idList = z.string().regex(/^\d+(,\d+)*$/, 'A comma-separated list of setup ids')
  .transform(s => [...new Set(s.split(',').map(Number))])
  .refine(list => list.length <= 30, 'At most 30 setups')

/** GET /api/bench-tests/:id/analysis and .../analysis/csv */
export const AnalysisQuery = z.object({
  /** Setup ids; default every live setup with included pulls. */
  setups: idList.optional(),
  /** Setup the gains are taken against; default the bench test's baseline (or the first chosen). */
  baseline: IdSchema.optional(),
  /** Default the bench test's default standard. */
  standard: CorrectionStandardSchema.optional(),
  units: z.enum(ids(ANALYSIS_UNITS)).optional(),
  /** Points per displayed curve (LTTB); figures always come from the full data. */
  maxPoints: z.coerce.number().int().min(20).max(2000).optional(),
})
export type AnalysisQueryInput = z.infer<typeof AnalysisQuery>

export interface CurvePoint { rpm: number, torque: number, power: number }

export interface AnalysisPull {
  pullId: number
  number: number
  fileName: string
  weather: Weather | null
  dynoCorrected: boolean
  /** Correction factor applied to this pull (1 for a pull the dyno already corrected, or for 'none'). */
  factor: number
  /** Peak power of the pull's own samples, corrected by its factor. */
  peakPower: AtRpm
}

export interface AnalysisSetup {
  setupId: number
  label: string
  position: number
  /** The setup this analysis takes gains against (baselineSetupId). */
  isBaseline: boolean
  pulls: AnalysisPull[]
  spreadPct: number | null
  outlierPullId: number | null
  idleVacuumInHg: number | null
  rpmFrom: number
  rpmTo: number
  /** The averaged, corrected curve thinned for drawing. */
  curve: CurvePoint[]
}

export interface GainCurve { setupId: number, againstSetupId: number, curve: CurvePoint[] }

export interface AnalysisGains {
  peakPower: number
  peakPowerPct: number
  peakTorque: number
  peakTorquePct: number
  averagePower: number
  averagePowerPct: number
  averageTorque: number
  averageTorquePct: number
  largestGain: { power: AtRpm, torque: AtRpm }
  /** Smallest gain on the grid: negative where the setup loses. */
  largestLoss: { power: AtRpm, torque: AtRpm }
  crossovers: { powerRpm: number[], torqueRpm: number[] }
  idleVacuumInHg: number | null
  /** null when no setup of the two has repeat pulls to judge by. */
  withinRepeatability: { peakPower: boolean | null, peakTorque: boolean | null, averagePower: boolean | null, averageTorque: boolean | null }
}

export interface AnalysisRow {
  setupId: number
  label: string
  isBaseline: boolean
  peakPower: AtRpm
  peakTorque: AtRpm
  /** Over the table's shared band. */
  averagePower: number
  averageTorque: number
  powerBand: RpmRange
  spreadPct: number | null
  idleVacuumInHg: number | null
  vsBaseline: AnalysisGains | null
  vsPrevious: AnalysisGains | null
}

export interface AnalysisResponse {
  benchTestId: number
  standard: CorrectionStandard
  standardLabel: string
  units: { id: AnalysisUnits, power: 'hp' | 'kW', torque: 'lb-ft' | 'N-m' }
  /** The setup gains are taken against; first row of the table. */
  baselineSetupId: number
  /** Chosen setups in table order: baseline first, then by position. */
  setups: AnalysisSetup[]
  /** Gain curves (setup minus baseline) on the shared grid. */
  gains: GainCurve[]
  table: { band: RpmRange, rows: AnalysisRow[] }
  /** Setups left out (no included pulls) and other notes for the page. */
  notes: string[]
}
