// Revisions: the content of a story at each explicit save, state change and
// restore, and one coalescing revision per autosave run. State revisions are kept
// for ever; of the rest the newest STORY_LIMITS.keptRevisions.
import type { Knex } from 'knex'
import type { Db } from '../../utils/db'
import {
  STORY_LIMITS,
  type RevisionComparison, type RevisionKind, type StoryContent, type StoryRevision, type StoryRevisionSummary,
} from '#shared/types/stories'
import type { StoryState } from '#shared/types/story-workflow'
import type { CurrentUser } from '#shared/types/users'
import { diffLines } from '#shared/utils/story-diff'
import { saveStoryContent } from './save'
import { requireStoryRow, storyContent, type StoryRow } from './stories'

interface RevisionRow {
  id: number
  story_id: number
  kind: RevisionKind
  story_version: number
  state: StoryState
  author_id: number | null
  author_name: string | null
  note: string
  content: string
  created_at: Date | string
  updated_at: Date | string
}

const CONTENT_FIELDS: (keyof StoryContent)[] = ['headline', 'deck', 'body', 'slug', 'heroPhotoId', 'tags', 'engineFamily', 'partType', 'searchTitle', 'searchDescription', 'bylineIds']

function parseContent(raw: unknown): StoryContent {
  const c = parseJsonColumn<Partial<StoryContent>>(raw, {})
  return {
    headline: String(c.headline ?? ''),
    deck: String(c.deck ?? ''),
    body: String(c.body ?? ''),
    slug: String(c.slug ?? ''),
    heroPhotoId: typeof c.heroPhotoId === 'number' ? c.heroPhotoId : null,
    tags: Array.isArray(c.tags) ? c.tags.map(String) : [],
    engineFamily: (c.engineFamily ?? 'other') as StoryContent['engineFamily'],
    partType: (c.partType ?? 'other') as StoryContent['partType'],
    searchTitle: String(c.searchTitle ?? ''),
    searchDescription: String(c.searchDescription ?? ''),
    bylineIds: Array.isArray(c.bylineIds) ? c.bylineIds.map(Number).filter(Number.isInteger) : [],
  }
}

function toSummary(row: RevisionRow): StoryRevisionSummary {
  return {
    id: Number(row.id),
    storyId: row.story_id,
    kind: row.kind,
    storyVersion: row.story_version,
    state: row.state,
    author: row.author_id === null ? null : { userId: row.author_id, displayName: row.author_name ?? '' },
    note: row.note,
    createdAt: isoTimeRequired(row.created_at),
    updatedAt: isoTimeRequired(row.updated_at),
  }
}

const toRevision = (row: RevisionRow): StoryRevision => ({ ...toSummary(row), content: parseContent(row.content) })

function revisionQuery(db: Db, storyId: number) {
  return db('story_revisions').leftJoin('users', 'users.id', 'story_revisions.author_id')
    .where('story_revisions.story_id', storyId)
    .select('story_revisions.*', 'users.display_name as author_name')
}

/**
 * Records the story row as it now is. An autosave overwrites the newest revision
 * when that is an autosave by the same person (one typing run, one revision).
 */
export async function writeRevision(trx: Knex.Transaction, row: StoryRow, kind: RevisionKind, authorId: number | null, note = ''): Promise<void> {
  const content = JSON.stringify(await storyContent(trx, row))
  if (kind === 'autosave') {
    const newest = await trx('story_revisions').where('story_id', row.id).orderBy('id', 'desc').first('id', 'kind', 'author_id')
    if (newest && newest.kind === 'autosave' && newest.author_id === authorId) {
      await trx('story_revisions').where('id', newest.id).update({ content, story_version: row.version, state: row.state, updated_at: trx.raw('NOW(3)') })
      return
    }
  }
  await trx('story_revisions').insert({ story_id: row.id, kind, story_version: row.version, state: row.state, author_id: authorId, note: note.slice(0, 300), content })
  if (kind !== 'state') await pruneRevisions(trx, row.id)
}

async function pruneRevisions(trx: Knex.Transaction, storyId: number): Promise<void> {
  const oldestKept = await trx('story_revisions').where('story_id', storyId).whereNot('kind', 'state')
    .orderBy('id', 'desc').offset(STORY_LIMITS.keptRevisions - 1).first('id')
  if (!oldestKept) return
  await trx('story_revisions').where('story_id', storyId).whereNot('kind', 'state').where('id', '<', oldestKept.id).delete()
}

export async function listRevisions(db: Db, user: CurrentUser, storyId: number): Promise<StoryRevisionSummary[]> {
  await requireStoryRow(db, user, storyId)
  const rows = await revisionQuery(db, storyId).orderBy('story_revisions.id', 'desc') as RevisionRow[]
  return rows.map(toSummary)
}

async function findRevision(db: Db, storyId: number, revisionId: number): Promise<StoryRevision> {
  const row = await revisionQuery(db, storyId).where('story_revisions.id', revisionId).first() as RevisionRow | undefined
  if (!row) notFound('No such revision of this story.')
  return toRevision(row)
}

export async function getRevision(db: Db, user: CurrentUser, storyId: number, revisionId: number): Promise<StoryRevision> {
  await requireStoryRow(db, user, storyId)
  return findRevision(db, storyId, revisionId)
}

export async function compareRevisions(db: Db, user: CurrentUser, storyId: number, fromId: number, toId: number): Promise<RevisionComparison> {
  await requireStoryRow(db, user, storyId)
  const [from, to] = await Promise.all([findRevision(db, storyId, fromId), findRevision(db, storyId, toId)])
  const changedFields = CONTENT_FIELDS.filter(f => JSON.stringify(from.content[f]) !== JSON.stringify(to.content[f]))
  return { from, to, changedFields, bodyDiff: diffLines(from.content.body, to.content.body) }
}

/**
 * The revision's content becomes the story's (a new version and a `restore`
 * revision); the state stays. A hero photo deleted since, or bylines who can no
 * longer be bylines, are left as they are now rather than refusing the restore.
 */
export async function restoreRevision(db: Db, user: CurrentUser, storyId: number, revisionId: number, version: number) {
  const story = await requireStoryRow(db, user, storyId)
  const revision = await findRevision(db, storyId, revisionId)
  const c = revision.content
  const heroStillThere = c.heroPhotoId === null || Boolean(await db('photos').where({ id: c.heroPhotoId, bench_test_id: story.bench_test_id }).first('id'))
  const validBylines = c.bylineIds.length
    ? await db('users').whereIn('id', c.bylineIds).where('disabled', false).whereIn('role', ['writer', 'editor', 'admin']).pluck('id') as number[]
    : []
  const bylineIds = c.bylineIds.filter(id => validBylines.includes(id))
  const keepsMe = user.role !== 'writer' || bylineIds.includes(user.id)
  return saveStoryContent(db, user, storyId, {
    version,
    headline: c.headline,
    deck: c.deck,
    body: c.body,
    slug: c.slug,
    ...(heroStillThere ? { heroPhotoId: c.heroPhotoId } : {}),
    tags: c.tags,
    engineFamily: c.engineFamily,
    partType: c.partType,
    searchTitle: c.searchTitle,
    searchDescription: c.searchDescription,
    ...(bylineIds.length && keepsMe ? { bylineIds } : {}),
  }, { kind: 'restore', note: `From the revision of ${revision.createdAt} (version ${revision.storyVersion})` })
}
