// Stories: rows, access and the DTOs. Ownership lives in the SQL: a writer reaches
// a story only through a byline row of their own (404 otherwise); editors and
// admins reach every story.
import type { Knex } from 'knex'
import type { Db } from '../../utils/db'
import type { EngineFamily, PartType } from '#shared/types/catalog'
import type { Story, StoryByline, StoryContent, StoryLock, StorySummary } from '#shared/types/stories'
import type { StoryState } from '#shared/types/story-workflow'
import { allowedActions, mayEditContent } from '#shared/stories/workflow'
import type { CurrentUser } from '#shared/types/users'
import { liveLockRows, toStoryLock } from './locks'
import { seesAllBenchTests } from '../workspace/bench-test-access'

export interface StoryRow {
  id: number
  bench_test_id: number
  slug: string
  headline: string
  deck: string
  body: string
  hero_photo_id: number | null
  engine_family: string
  part_type: string
  search_title: string
  search_description: string
  state: StoryState
  state_changed_at: Date | string
  scheduled_at: Date | string | null
  published_at: Date | string | null
  version: number
  number_check_seen_version: number | null
  /** The edition readers see (set when one goes live). */
  published_edition_id: number | null
  created_by: number
  created_at: Date | string
  updated_at: Date | string
}

/** The stories this user may reach, as a query (ownership in the WHERE). */
export function visibleStories(db: Db, user: CurrentUser) {
  const query = db<StoryRow>('stories')
  if (!seesAllBenchTests(user)) {
    query.whereExists(db('story_bylines').whereRaw('story_bylines.story_id = stories.id').where('story_bylines.user_id', user.id).select(db.raw('1')))
  }
  return query
}

/** The story row, or 404 when it does not exist or is not this user's to reach; `lock` takes a row lock. */
export async function requireStoryRow(db: Db, user: CurrentUser, id: number, opts: { lock?: boolean } = {}): Promise<StoryRow> {
  const query = visibleStories(db, user).where('stories.id', id).select('stories.*')
  if (opts.lock) query.forUpdate()
  const row = await query.first() as StoryRow | undefined
  if (!row) notFound('No such story.')
  return row
}

interface StoryExtras {
  bylines: Map<number, StoryByline[]>
  tags: Map<number, string[]>
  locks: Map<number, StoryLock>
  benchTitles: Map<number, string>
  names: Map<number, string>
}

function groupBy<T, K>(rows: T[], key: (r: T) => K): Map<K, T[]> {
  const out = new Map<K, T[]>()
  for (const r of rows) out.set(key(r), [...(out.get(key(r)) ?? []), r])
  return out
}

async function loadExtras(db: Db, rows: StoryRow[]): Promise<StoryExtras> {
  const ids = rows.map(r => r.id)
  if (!ids.length) return { bylines: new Map(), tags: new Map(), locks: new Map(), benchTitles: new Map(), names: new Map() }
  const [bylineRows, tagRows, lockRows, benchRows, creatorRows] = await Promise.all([
    db('story_bylines').join('users', 'users.id', 'story_bylines.user_id').whereIn('story_bylines.story_id', ids)
      .orderBy('story_bylines.position').select('story_bylines.story_id', 'users.id as user_id', 'users.display_name') as Promise<{ story_id: number, user_id: number, display_name: string }[]>,
    db('story_tags').whereIn('story_id', ids).orderBy('position').select('story_id', 'tag') as Promise<{ story_id: number, tag: string }[]>,
    liveLockRows(db, ids),
    db('bench_tests').whereIn('id', [...new Set(rows.map(r => r.bench_test_id))]).select('id', 'title') as Promise<{ id: number, title: string }[]>,
    db('users').whereIn('id', [...new Set(rows.map(r => r.created_by))]).select('id', 'display_name') as Promise<{ id: number, display_name: string }[]>,
  ])
  return {
    bylines: new Map([...groupBy(bylineRows, r => r.story_id)].map(([k, v]) => [k, v.map(b => ({ userId: b.user_id, displayName: b.display_name }))])),
    tags: new Map([...groupBy(tagRows, r => r.story_id)].map(([k, v]) => [k, v.map(t => t.tag)])),
    locks: new Map(lockRows.map(l => [l.story_id, toStoryLock(l)])),
    benchTitles: new Map(benchRows.map(b => [b.id, b.title])),
    names: new Map(creatorRows.map(u => [u.id, u.display_name])),
  }
}

function toSummary(row: StoryRow, extras: StoryExtras): StorySummary {
  return {
    id: row.id,
    benchTestId: row.bench_test_id,
    benchTestTitle: extras.benchTitles.get(row.bench_test_id) ?? '',
    slug: row.slug,
    headline: row.headline,
    deck: row.deck,
    bylines: extras.bylines.get(row.id) ?? [],
    heroPhotoId: row.hero_photo_id,
    tags: extras.tags.get(row.id) ?? [],
    engineFamily: row.engine_family as EngineFamily,
    partType: row.part_type as PartType,
    state: row.state,
    scheduledAt: isoTime(row.scheduled_at),
    publishedAt: isoTime(row.published_at),
    version: row.version,
    lock: extras.locks.get(row.id) ?? null,
    createdAt: isoTimeRequired(row.created_at),
    updatedAt: isoTimeRequired(row.updated_at),
  }
}

export function isByline(story: Pick<StorySummary, 'bylines'>, user: CurrentUser): boolean {
  return story.bylines.some(b => b.userId === user.id)
}

export async function storySummaries(db: Db, rows: StoryRow[]): Promise<StorySummary[]> {
  const extras = await loadExtras(db, rows)
  return rows.map(r => toSummary(r, extras))
}

/** The full story as `user` sees it, with what they may do now. */
export async function storyDto(db: Db, row: StoryRow, user: CurrentUser): Promise<Story> {
  const extras = await loadExtras(db, [row])
  const summary = toSummary(row, extras)
  const own = isByline(summary, user)
  return {
    ...summary,
    body: row.body,
    searchTitle: row.search_title,
    searchDescription: row.search_description,
    bylineIds: summary.bylines.map(b => b.userId),
    createdBy: { userId: row.created_by, displayName: extras.names.get(row.created_by) ?? '' },
    numberCheckSeenVersion: row.number_check_seen_version,
    allowedActions: allowedActions(row.state, user.role, own),
    mayEdit: mayEditContent(row.state, user.role, own),
  }
}

export async function getStory(db: Db, user: CurrentUser, id: number): Promise<Story> {
  return storyDto(db, await requireStoryRow(db, user, id), user)
}

/** The content fields of a story row, as revisions keep them. */
export async function storyContent(db: Db, row: StoryRow): Promise<StoryContent> {
  const [bylines, tags] = await Promise.all([
    db('story_bylines').where('story_id', row.id).orderBy('position').pluck('user_id') as Promise<number[]>,
    db('story_tags').where('story_id', row.id).orderBy('position').pluck('tag') as Promise<string[]>,
  ])
  return {
    headline: row.headline,
    deck: row.deck,
    body: row.body,
    slug: row.slug,
    heroPhotoId: row.hero_photo_id,
    tags,
    engineFamily: row.engine_family as EngineFamily,
    partType: row.part_type as PartType,
    searchTitle: row.search_title,
    searchDescription: row.search_description,
    bylineIds: bylines,
  }
}

export async function storyById(db: Db, id: number): Promise<StoryRow> {
  const row = await db<StoryRow>('stories').where({ id }).first()
  if (!row) notFound('No such story.')
  return row
}

const isDeadlock = (error: unknown) => (error as { code?: string }).code === 'ER_LOCK_DEADLOCK' || (error as { errno?: number }).errno === 1213

/** A transaction retried when MariaDB picks it as a deadlock victim (it was rolled back whole). */
export async function storyTransaction<T>(db: Db, work: (trx: Knex.Transaction) => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try { return await db.transaction(work) }
    catch (error) {
      if (!isDeadlock(error) || attempt >= 3) throw error
    }
  }
}

/** 409 with the story as it is now: the version the caller read is stale. */
export async function staleStory(db: Db, user: CurrentUser, id: number): Promise<never> {
  const current = await getStory(db, user, id)
  staleVersion(current, 'story')
}
