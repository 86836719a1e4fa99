// Readers' remembered graph settings. Any signed-in role may keep them; null
// means "as the story chose" (its own standard, hp and lb-ft).
import type { z } from 'zod'
import type { Db } from '../../utils/db'
import { ReaderPreferencesBody, type ReaderPreferences } from '#shared/types/magazine'

export async function readerPreferences(db: Db, userId: number): Promise<ReaderPreferences> {
  const row = await db('user_preferences').where({ user_id: userId }).first('units', 'correction_standard') as { units: string | null, correction_standard: string | null } | undefined
  // Values are checked on the way out too, so a standard dropped from the list later reads as unset.
  const units = ReaderPreferencesBody.shape.units.safeParse(row?.units ?? null)
  const standard = ReaderPreferencesBody.shape.standard.safeParse(row?.correction_standard ?? null)
  return { units: units.success ? units.data ?? null : null, standard: standard.success ? standard.data ?? null : null }
}

export async function saveReaderPreferences(db: Db, userId: number, input: z.infer<typeof ReaderPreferencesBody>): Promise<ReaderPreferences> {
  const current = await readerPreferences(db, userId)
  const next: ReaderPreferences = {
    units: input.units === undefined ? current.units : input.units,
    standard: input.standard === undefined ? current.standard : input.standard,
  }
  await db('user_preferences')
    .insert({ user_id: userId, units: next.units, correction_standard: next.standard })
    .onConflict('user_id').merge(['units', 'correction_standard'])
  return next
}
