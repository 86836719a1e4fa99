// Creating and saving stories. Every save names the version it read and is one
// transaction: the row (UPDATE ... WHERE version = ?), bylines, tags, the photos it
// uses and its revision, or nothing at all.
import type { Knex } from 'knex'
import type { Db } from '../../utils/db'
import type { CreateStoryInput, RevisionKind, Story, UpdateStoryInput } from '#shared/types/stories'
import { rolesAtLeast } from '#shared/accounts/roles'
import { mayEditContent } from '#shared/stories/workflow'
import type { CurrentUser } from '#shared/types/users'
import { syncStoryPhotos } from './photos'
import { writeRevision } from './revisions'
import { getStory, requireStoryRow, storyById, storyDto, storyTransaction } from './stories'
import { requireBenchTest } from '../workspace/bench-test-access'
import { slugify } from '../workspace/bench-test-core'

const BYLINE_ROLES = rolesAtLeast('writer')

/** Bylines are active writers, editors or admins; a writer may not take themselves off. */
async function checkBylines(db: Db, user: CurrentUser, ids: number[]): Promise<void> {
  const rows = await db('users').whereIn('id', ids).where('disabled', false).whereIn('role', BYLINE_ROLES).pluck('id') as number[]
  const missingIds = ids.filter(id => !rows.includes(id))
  if (missingIds.length) invalidField('bylineIds', `User ${missingIds.join(', ')} cannot be a byline (bylines are active writers, editors or admins).`)
  if (user.role === 'writer' && !ids.includes(user.id)) invalidField('bylineIds', 'Keep yourself among the bylines; otherwise the story leaves your desk.')
}

async function checkHeroPhoto(db: Db, benchTestId: number, photoId: number | null | undefined): Promise<void> {
  if (photoId === null || photoId === undefined) return
  const found = await db('photos').where({ id: photoId, bench_test_id: benchTestId }).first('id')
  if (!found) invalidField('heroPhotoId', `Photo ${photoId} is not a photo of this story's bench test.`)
}

async function freeSlug(db: Db, headline: string): Promise<string> {
  const base = slugify(headline).slice(0, 110).replace(/-+$/, '') || 'story'
  const taken = new Set(await db('stories').where('slug', base).orWhere('slug', 'like', `${base}-%`).pluck('slug') as string[])
  if (!taken.has(base)) return base
  for (let n = 2; ; n++) if (!taken.has(`${base}-${n}`)) return `${base}-${n}`
}

function slugTaken(slug: string): never {
  throw httpError(409, `Another story already uses the slug "${slug}".`, { issues: [{ path: 'slug', message: 'Already used by another story' }] })
}

/**
 * Makes a story's byline or tag rows equal to `values`, touching rows by primary
 * key only: a DELETE ... WHERE story_id = ? would take gap locks that deadlock two
 * stories saved at once.
 */
async function replaceList(trx: Knex.Transaction, table: 'story_bylines' | 'story_tags', storyId: number, column: 'user_id' | 'tag', values: (number | string)[]) {
  const existing = await trx(table).where('story_id', storyId).select(column, 'position') as Record<string, number | string>[]
  const gone = existing.map(r => r[column]!).filter(v => !values.includes(v))
  for (const value of gone) await trx(table).where({ story_id: storyId, [column]: value }).delete()
  for (const [position, value] of values.entries()) {
    const row = existing.find(r => r[column] === value)
    if (!row) await trx(table).insert({ story_id: storyId, [column]: value, position })
    else if (Number(row.position) !== position) await trx(table).where({ story_id: storyId, [column]: value }).update({ position })
  }
}

export async function createStoryDraft(db: Db, user: CurrentUser, input: CreateStoryInput): Promise<Story> {
  const benchTest = await requireBenchTest(db, user, input.benchTestId)
  const bylineIds = input.bylineIds ?? [user.id]
  await checkBylines(db, user, bylineIds)
  const id = await withFreeSlug(async () => {
    try {
      return await storyTransaction(db, async (trx) => {
        const slug = input.slug ?? await freeSlug(trx, input.headline)
        const [storyId] = await trx('stories').insert({
          bench_test_id: benchTest.id,
          slug,
          headline: input.headline,
          deck: input.deck ?? '',
          body: input.body ?? '',
          engine_family: input.engineFamily ?? benchTest.engine_family,
          part_type: input.partType ?? benchTest.part_type,
          created_by: user.id,
        })
        const idNum = Number(storyId)
        await replaceList(trx, 'story_bylines', idNum, 'user_id', bylineIds)
        await replaceList(trx, 'story_tags', idNum, 'tag', input.tags ?? [])
        const row = await storyById(trx, idNum)
        await syncStoryPhotos(trx, row)
        await writeRevision(trx, row, 'created', user.id)
        return idNum
      })
    }
    catch (error) {
      // A slug the writer chose is theirs to change; a derived one moves on to the next free one.
      if (input.slug && isDuplicateEntry(error)) slugTaken(input.slug)
      throw error
    }
  })
  return getStory(db, user, id)
}

const FIELD_COLUMNS = {
  headline: 'headline',
  deck: 'deck',
  body: 'body',
  slug: 'slug',
  heroPhotoId: 'hero_photo_id',
  engineFamily: 'engine_family',
  partType: 'part_type',
  searchTitle: 'search_title',
  searchDescription: 'search_description',
} as const

/**
 * A save (PATCH), an autosave or a restore: 409 with the current story when the
 * version is stale, 409 when this user may not edit the story in its state.
 */
export async function saveStoryContent(db: Db, user: CurrentUser, id: number, input: UpdateStoryInput, opts: { kind?: RevisionKind, note?: string } = {}): Promise<Story> {
  const kind: RevisionKind = opts.kind ?? (input.autosave ? 'autosave' : 'save')
  try {
    await storyTransaction(db, async (trx) => {
      const row = await requireStoryRow(trx, user, id, { lock: true })
      if (row.version !== input.version) staleVersion(await storyDto(trx, row, user), 'story')
      const own = await trx('story_bylines').where({ story_id: id, user_id: user.id }).first('user_id')
      if (!mayEditContent(row.state, user.role, Boolean(own))) {
        throw httpError(409, 'This story is with the desk now; only editors change it until changes are asked for.')
      }
      if (input.bylineIds) await checkBylines(trx, user, input.bylineIds)
      await checkHeroPhoto(trx, row.bench_test_id, input.heroPhotoId)

      const patch: Record<string, unknown> = {}
      for (const [field, column] of Object.entries(FIELD_COLUMNS)) {
        const value = input[field as keyof typeof FIELD_COLUMNS]
        if (value !== undefined) patch[column] = value
      }
      const updated = await trx('stories').where({ id, version: input.version })
        .update({ ...patch, version: trx.raw('version + 1') })
      if (!updated) staleVersion(await storyDto(trx, row, user), 'story')
      if (input.bylineIds) await replaceList(trx, 'story_bylines', id, 'user_id', input.bylineIds)
      if (input.tags) await replaceList(trx, 'story_tags', id, 'tag', input.tags)
      const after = await storyById(trx, id)
      if (input.body !== undefined || input.heroPhotoId !== undefined) await syncStoryPhotos(trx, after)
      await writeRevision(trx, after, kind, user.id, opts.note)
    })
  }
  catch (error) {
    if (isDuplicateEntry(error) && input.slug) slugTaken(input.slug)
    throw error
  }
  return getStory(db, user, id)
}
