// The build sheet: one per bench test, written whole (PUT) with the version read.
import type { Db } from '../../utils/db'
import { ciToLiters, displacementCi } from '../../../shared/dyno/index'
import type { BuildSheet, BuildSheetInput } from '../../../shared/types/build-sheets'
import { httpError, staleVersion } from '../../utils/http-errors'
import { asNumberOrNull, isoTimeRequired, type RowOf } from '../../utils/rows'

/** The build_sheets row: the DTO's fields as columns, without the derived displacement. */
type BuildSheetRow = Omit<RowOf<BuildSheet>, 'displacement_ci' | 'displacement_l' | 'updated_at'> & { updated_at: Date | string }

function toBuildSheet(row: BuildSheetRow): BuildSheet {
  const boreIn = Number(row.bore_in)
  const strokeIn = Number(row.stroke_in)
  const cylinders = Number(row.cylinders)
  const ci = displacementCi({ boreIn, strokeIn, cylinders })
  return {
    benchTestId: row.bench_test_id,
    boreIn,
    strokeIn,
    cylinders,
    displacementCi: ci,
    displacementL: ciToLiters(ci),
    compressionRatio: asNumberOrNull(row.compression_ratio),
    heads: row.heads,
    induction: row.induction,
    fuel: row.fuel,
    ignition: row.ignition,
    exhaust: row.exhaust,
    notes: row.notes,
    version: row.version,
    updatedAt: isoTimeRequired(row.updated_at),
  }
}

export async function getBuildSheet(db: Db, benchTestId: number): Promise<BuildSheet | null> {
  const row = await db<BuildSheetRow>('build_sheets').where({ bench_test_id: benchTestId }).first()
  return row ? toBuildSheet(row) : null
}

/** Creates the sheet (version 0: "there was none when I read") or replaces it (the version read). */
export async function putBuildSheet(db: Db, benchTestId: number, input: BuildSheetInput): Promise<BuildSheet> {
  const { version, boreIn, strokeIn, compressionRatio, ...texts } = input
  const values = { bore_in: boreIn, stroke_in: strokeIn, cylinders: input.cylinders, compression_ratio: compressionRatio, heads: texts.heads, induction: texts.induction, fuel: texts.fuel, ignition: texts.ignition, exhaust: texts.exhaust, notes: texts.notes }
  const stale = async (): Promise<never> => {
    const current = await getBuildSheet(db, benchTestId)
    if (!current) throw httpError(409, 'There is no build sheet yet: send version 0 to create it.', { currentVersion: 0, current: null })
    return staleVersion(current, 'build sheet')
  }
  if (version === 0) {
    try { await db('build_sheets').insert({ bench_test_id: benchTestId, ...values }) }
    catch (error) {
      if ((error as { code?: string }).code === 'ER_DUP_ENTRY') await stale()
      throw error
    }
  }
  else {
    const count = await db('build_sheets').where({ bench_test_id: benchTestId, version }).update({ ...values, version: db.raw('version + 1') })
    if (!count) await stale()
  }
  return (await getBuildSheet(db, benchTestId))!
}
