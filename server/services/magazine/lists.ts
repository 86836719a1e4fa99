// The reader's side of the stories tables: only published stories, newest first.
// Ownership does not apply here; the state does (a draft is nobody's business but
// the desk's, and the desk reads it through /api/stories).
import type { Knex } from 'knex'
import type { Db } from '../../utils/db'
import { z } from 'zod'
import { ENGINE_FAMILIES, PART_TYPES, type EngineFamily, type PartType } from '#shared/types/catalog'
import { labelOf } from '#shared/catalog/labels'
import { EngineFamilySchema, PartTypeSchema } from '#shared/types/catalog-schemas'
import { TagSchema, type StoryPhoto } from '#shared/types/stories'
import type { MagazineHome, MagazinePage, MagazineStoryCard } from '#shared/types/magazine'
import type { PhotoRecord } from '../photos/access'
import { catchUpSearchIndex, searchHits } from './search'
import { publicStories, publishedTextColumns } from './published'
import { toStoryPhoto } from '../stories/photos'

export const MAGAZINE_PAGE_SIZE = 12

const PageQuery = z.object({ page: z.coerce.number().int().min(1).max(1000).default(1) })
export const MagazineListQuery = PageQuery
export const MagazineSearchQuery = PageQuery.extend({
  q: z.string().trim().min(2, 'Search for at least two letters').max(100, 'Keep the search under 100 characters'),
})
export const MagazineFamilyParams = z.object({ family: EngineFamilySchema })
export const MagazinePartParams = z.object({ type: PartTypeSchema })
export const MagazineTagParams = z.object({ tag: TagSchema })
export const MagazineSlugParams = z.object({ slug: z.string().trim().toLowerCase().regex(/^[a-z0-9-]{1,120}$/) })

interface StoryCardRow {
  id: number
  slug: string
  headline: string
  deck: string
  engine_family: EngineFamily
  part_type: PartType
  hero_photo_id: number | null
  published_at: Date | string
}

const cardColumns = (db: Db) => [
  'stories.id', 'stories.slug', ...publishedTextColumns(db), 'stories.engine_family', 'stories.part_type',
  // Editions frozen before the hero was kept have no search title either: the row's hero then.
  db.raw('CASE WHEN edition.search_title IS NULL THEN stories.hero_photo_id ELSE edition.hero_photo_id END AS hero_photo_id'),
  'stories.published_at',
]

export async function magazinePhotos(db: Db, ids: readonly number[]): Promise<Map<number, StoryPhoto>> {
  if (ids.length === 0) return new Map()
  const wanted = [...new Set(ids)]
  const rows = new Map((await db<PhotoRecord>('photos').whereIn('id', wanted)).map(r => [r.id, r]))
  // In the order asked for (the body's), not the order the database happens to return.
  return new Map(wanted.filter(id => rows.has(id)).map(id => [id, toStoryPhoto(rows.get(id)!)]))
}

export async function magazineBylines(db: Db, storyIds: readonly number[]): Promise<Map<number, { userId: number, displayName: string }[]>> {
  const out = new Map<number, { userId: number, displayName: string }[]>()
  if (storyIds.length === 0) return out
  const rows = await db('story_bylines').join('users', 'users.id', 'story_bylines.user_id')
    .whereIn('story_bylines.story_id', storyIds)
    .orderBy('story_bylines.position').orderBy('users.id')
    .select('story_bylines.story_id as storyId', 'users.id as userId', 'users.display_name as displayName') as { storyId: number, userId: number, displayName: string }[]
  for (const r of rows) out.set(r.storyId, [...(out.get(r.storyId) ?? []), { userId: r.userId, displayName: r.displayName }])
  return out
}

export async function magazineTags(db: Db, storyIds: readonly number[]): Promise<Map<number, string[]>> {
  const out = new Map<number, string[]>()
  if (storyIds.length === 0) return out
  const rows = await db('story_tags').whereIn('story_id', storyIds).orderBy('position').orderBy('tag')
    .select('story_id as storyId', 'tag') as { storyId: number, tag: string }[]
  for (const r of rows) out.set(r.storyId, [...(out.get(r.storyId) ?? []), r.tag])
  return out
}

async function toCards(db: Db, rows: StoryCardRow[]): Promise<MagazineStoryCard[]> {
  const ids = rows.map(r => r.id)
  const [bylines, tags, photos] = await Promise.all([
    magazineBylines(db, ids),
    magazineTags(db, ids),
    magazinePhotos(db, rows.flatMap(r => (r.hero_photo_id ? [r.hero_photo_id] : []))),
  ])
  return rows.map(r => ({
    slug: r.slug,
    headline: r.headline,
    deck: r.deck,
    bylines: (bylines.get(r.id) ?? []).map(b => b.displayName),
    publishedAt: new Date(r.published_at).toISOString(),
    engineFamily: { id: r.engine_family, label: labelOf(ENGINE_FAMILIES, r.engine_family) },
    partType: { id: r.part_type, label: labelOf(PART_TYPES, r.part_type) },
    tags: tags.get(r.id) ?? [],
    hero: (r.hero_photo_id ? photos.get(r.hero_photo_id) : undefined) ?? null,
  }))
}

async function pageOf(db: Db, base: Knex.QueryBuilder, page: number, order: (q: Knex.QueryBuilder) => Knex.QueryBuilder = newestFirst): Promise<MagazinePage> {
  const counted = await base.clone().clearSelect().count({ n: '*' }).first() as { n: number | string } | undefined
  const total = Number(counted?.n ?? 0)
  const rows = await order(base.clone().select(cardColumns(db)))
    .limit(MAGAZINE_PAGE_SIZE).offset((page - 1) * MAGAZINE_PAGE_SIZE) as StoryCardRow[]
  return { stories: await toCards(db, rows), page, pageSize: MAGAZINE_PAGE_SIZE, total, pages: Math.max(1, Math.ceil(total / MAGAZINE_PAGE_SIZE)) }
}

const newestFirst = (q: Knex.QueryBuilder) => q.orderBy('stories.published_at', 'desc').orderBy('stories.id', 'desc')

export async function magazineHome(db: Db): Promise<MagazineHome> {
  const rows = await newestFirst(publicStories(db).select(cardColumns(db))).limit(MAGAZINE_PAGE_SIZE + 1) as StoryCardRow[]
  const cards = await toCards(db, rows)
  const featured = cards.find(c => c.hero) ?? cards[0] ?? null
  const [families, parts, tags] = await Promise.all([
    publicStories(db).groupBy('stories.engine_family').select('stories.engine_family as id').count({ n: '*' }) as unknown as Promise<{ id: EngineFamily, n: number | string }[]>,
    publicStories(db).groupBy('stories.part_type').select('stories.part_type as id').count({ n: '*' }) as unknown as Promise<{ id: PartType, n: number | string }[]>,
    publicStories(db).join('story_tags', 'story_tags.story_id', 'stories.id').groupBy('story_tags.tag')
      .select('story_tags.tag as tag').count({ n: '*' }).orderBy('n', 'desc').orderBy('tag').limit(30) as unknown as Promise<{ tag: string, n: number | string }[]>,
  ])
  const counted = <T extends string>(list: readonly { id: T, label: string }[], found: { id: T, n: number | string }[]) =>
    list.map(item => ({ id: item.id, label: item.label, count: Number(found.find(f => f.id === item.id)?.n ?? 0) })).filter(item => item.count > 0)
  return {
    featured,
    latest: cards.filter(c => c !== featured).slice(0, MAGAZINE_PAGE_SIZE),
    engineFamilies: counted(ENGINE_FAMILIES, families),
    partTypes: counted(PART_TYPES, parts),
    tags: tags.map(t => ({ tag: t.tag, count: Number(t.n) })),
  }
}

export function latestStories(db: Db, page: number): Promise<MagazinePage> {
  return pageOf(db, publicStories(db), page)
}

export function storiesByEngineFamily(db: Db, family: EngineFamily, page: number): Promise<MagazinePage> {
  return pageOf(db, publicStories(db).where('stories.engine_family', family), page)
}

export function storiesByPartType(db: Db, type: PartType, page: number): Promise<MagazinePage> {
  return pageOf(db, publicStories(db).where('stories.part_type', type), page)
}

export function storiesByTag(db: Db, tag: string, page: number): Promise<MagazinePage> {
  return pageOf(db, publicStories(db).whereExists(
    db('story_tags').whereRaw('story_tags.story_id = stories.id').where('story_tags.tag', tag),
  ), page)
}

export async function searchStories(db: Db, q: string, page: number): Promise<MagazinePage> {
  const hits = searchHits(db, q)
  if (!hits) return { stories: [], page, pageSize: MAGAZINE_PAGE_SIZE, total: 0, pages: 1 }
  await catchUpSearchIndex(db)
  return pageOf(db, publicStories(db).join(hits, 'hits.story_id', 'stories.id'), page,
    query => query.orderBy('hits.score', 'desc').orderBy('stories.published_at', 'desc').orderBy('stories.id', 'desc'))
}
