// Setups, their part cards and idle checks (docs/api/workspace.md).
import { z } from 'zod'
import { ids, positive, text } from '../workspace/fields'
import { MAX_PARTS_PER_SETUP, VersionSchema } from './workspace'

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
