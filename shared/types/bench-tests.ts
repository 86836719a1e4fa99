// Bench tests: the DTOs and request bodies of /api/bench-tests (docs/api/workspace.md).
import { z } from 'zod'
import type { CorrectionStandard } from '../dyno/types'
import { IsoDate, text } from '../workspace/fields'
import type { EngineFamily, PartType } from './catalog'
import { EngineFamilySchema, PartTypeSchema } from './catalog-schemas'
import type { BuildSheet } from './build-sheets'
import type { Setup } from './setups'
import { CorrectionStandardSchema, VersionSchema } from './workspace'

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

/** Every field of a bench test; creating one and changing one differ only in what may be left out. */
const BenchTestFields = z.object(benchTestFields)

/** POST /api/bench-tests. Omitted text fields are empty, dates null, standard SAE J1349 (JUN1990). */
export const CreateBenchTestBody = BenchTestFields
  .partial({ shop: true, dyno: true, testedFrom: true, testedTo: true, notes: true, defaultStandard: true })
  .refine(datesInOrder, DATES_ORDER)
export type CreateBenchTestInput = z.infer<typeof CreateBenchTestBody>

/** PATCH /api/bench-tests/:id: any fields, with the version read (first, as before). */
export const UpdateBenchTestBody = z.object({ version: VersionSchema })
  .extend(BenchTestFields.partial().shape)
  .refine(datesInOrder, DATES_ORDER)
export type UpdateBenchTestInput = z.infer<typeof UpdateBenchTestBody>

export const BenchTestListQuery = z.object({
  /** 'only': the deleted ones (to restore); otherwise deleted ones are left out. */
  deleted: z.enum(['only']).optional(),
  q: z.string().trim().max(100).optional(),
})

/** ?confirm=true on DELETE of a bench test or setup that has pulls. */
export const ConfirmQuery = z.object({ confirm: z.enum(['true', 'false']).optional() })

export interface BenchTestDetail {
  benchTest: BenchTest
  buildSheet: BuildSheet | null
  setups: Setup[]
}
