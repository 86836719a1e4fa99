// Bench test rows without a user in sight: the DTO, the slug, creation. Kept apart
// from the user-scoped reads (bench-tests.ts) so the demo seed, the benchmark and unit
// tests can use it outside Nitro.
import type { Knex } from 'knex'
import type { Db } from '../../utils/db'
import type { BenchTest, CreateBenchTestInput } from '../../../shared/types/bench-tests'
import type { CorrectionStandard } from '../../../shared/dyno/index'
import type { EngineFamily, PartType } from '../../../shared/types/catalog'
import { withFreeSlug } from '../../utils/slug-retry'
import { missing } from '../../utils/http-errors'
import { isoDay, isoTime, isoTimeRequired } from '../../utils/rows'
/** A bench_tests row as stored. */
export interface BenchTestRecord {
  id: number
  slug: string
  title: string
  engine_family: string
  part_type: string
  shop: string
  dyno: string
  tested_from: Date | string | null
  tested_to: Date | string | null
  notes: string
  owner_id: number
  default_standard: string
  version: number
  deleted_at: Date | string | null
  created_at: Date | string
  updated_at: Date | string
}

/** A bench_tests row joined with its owner's name (withOwner). */
export interface BenchTestRow extends BenchTestRecord {
  owner_name: string
}

export function toBenchTest(row: BenchTestRow): BenchTest {
  return {
    id: row.id,
    slug: row.slug,
    title: row.title,
    engineFamily: row.engine_family as EngineFamily,
    partType: row.part_type as PartType,
    shop: row.shop,
    dyno: row.dyno,
    testedFrom: isoDay(row.tested_from),
    testedTo: isoDay(row.tested_to),
    notes: row.notes,
    ownerId: row.owner_id,
    ownerName: row.owner_name,
    defaultStandard: row.default_standard as CorrectionStandard,
    version: row.version,
    createdAt: isoTimeRequired(row.created_at),
    updatedAt: isoTimeRequired(row.updated_at),
    deletedAt: isoTime(row.deleted_at),
  }
}

export function withOwner(query: Knex.QueryBuilder) {
  return query.join('users as owner', 'owner.id', 'bench_tests.owner_id').select('bench_tests.*', 'owner.display_name as owner_name')
}

/** A bench test by id, whoever owns it: for code that has already checked access. */
export async function benchTestById(db: Db, id: number): Promise<BenchTest> {
  const row = await withOwner(db('bench_tests').where('bench_tests.id', id)).first() as BenchTestRow | undefined
  if (!row) missing('No such bench test.')
  return toBenchTest(row)
}

/** URL-safe, readable and unique: "Long-tube headers on a 6.3 L V8" -> "long-tube-headers-on-a-6-3-l-v8". */
export function slugify(title: string): string {
  const slug = title.normalize('NFKD').replace(/[\u0300-\u036F]/g, '').toLowerCase()
    .replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 100).replace(/-+$/, '')
  return slug || 'bench-test'
}

async function uniqueSlug(db: Db, title: string): Promise<string> {
  const base = slugify(title)
  const taken = new Set((await db('bench_tests').where('slug', base).orWhere('slug', 'like', `${base}-%`).pluck('slug')) as string[])
  if (!taken.has(base)) return base
  for (let n = 2; ; n++) if (!taken.has(`${base}-${n}`)) return `${base}-${n}`
}

export async function createBenchTest(db: Db, ownerId: number, input: CreateBenchTestInput): Promise<BenchTest> {
  // Two writers choosing the same title at once: the later one takes the next free slug.
  return withFreeSlug(() => db.transaction(async (trx) => {
    const [inserted] = await trx('bench_tests').insert({
      slug: await uniqueSlug(trx, input.title),
      title: input.title,
      engine_family: input.engineFamily,
      part_type: input.partType,
      shop: input.shop ?? '',
      dyno: input.dyno ?? '',
      tested_from: input.testedFrom ?? null,
      tested_to: input.testedTo ?? null,
      notes: input.notes ?? '',
      owner_id: ownerId,
      default_standard: input.defaultStandard ?? 'sae-j1349-1990',
    })
    return benchTestById(trx, Number(inserted))
  }))
}
