// The build sheet of a bench test: the engine as built (docs/api/workspace.md).
import { z } from 'zod'
import { positive, text } from '../workspace/fields'
import { VersionSchema } from './workspace'

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
