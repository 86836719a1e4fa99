// The photos a story uses: its hero and every ::photo / ::gallery in its body, kept
// in story_photos on every save so "is this photo public?" is one indexed query.
import type { Knex } from 'knex'
import type { Db } from '../../utils/db'
import type { PhotoMissingAltText } from '#shared/types/photos'
import type { StoryPhoto } from '#shared/types/stories'
import { photosUsed } from '#shared/utils/story-body'
import type { PhotoRecord } from '../photos/access'
import { toPhoto } from '../photos/photos'
import type { StoryRow } from './stories'

/** Hero first, then the body's photos in order; only ids of the story's bench test count. */
export async function usedPhotoIds(db: Db, row: Pick<StoryRow, 'bench_test_id' | 'hero_photo_id' | 'body'>): Promise<number[]> {
  const wanted = [...new Set([...(row.hero_photo_id ? [row.hero_photo_id] : []), ...photosUsed(row.body)])]
  if (!wanted.length) return []
  const found = new Set(await db('photos').whereIn('id', wanted).where('bench_test_id', row.bench_test_id).pluck('id') as number[])
  return wanted.filter(id => found.has(id))
}

export async function syncStoryPhotos(trx: Knex.Transaction, row: StoryRow): Promise<void> {
  const ids = await usedPhotoIds(trx, row)
  // By primary key only (no range delete): gap locks would deadlock concurrent saves.
  const existing = await trx('story_photos').where('story_id', row.id).pluck('photo_id') as number[]
  for (const id of existing.filter(id => !ids.includes(id))) await trx('story_photos').where({ story_id: row.id, photo_id: id }).delete()
  const added = ids.filter(id => !existing.includes(id))
  if (added.length) await trx('story_photos').insert(added.map(photo_id => ({ story_id: row.id, photo_id })))
}

/**
 * Whether anyone may see this photo: it is used by a published story. For the
 * photo routes (issue 5's photoIsPublic in server/services/photos/access.ts).
 */
export async function photoInPublishedStory(db: Db, photoId: number): Promise<boolean> {
  const row = await db('story_photos').join('stories', 'stories.id', 'story_photos.story_id')
    .where('story_photos.photo_id', photoId).where('stories.state', 'published').first('stories.id')
  return Boolean(row)
}

/** Photos the story uses that have no alt text yet (submit and approval need it). */
export async function usedPhotosWithoutAltText(db: Db, row: StoryRow): Promise<PhotoMissingAltText[]> {
  const ids = await usedPhotoIds(db, row)
  if (!ids.length) return []
  const rows = await db('photos').whereIn('id', ids).where('alt_text', '').select('id', 'original_name') as { id: number, original_name: string }[]
  return rows.map(r => ({ id: r.id, originalName: r.original_name }))
}

/** A photo as stories show it; `urlFor` makes the address of one web size (default: the photo route). */
export function toStoryPhoto(row: PhotoRecord, urlFor?: (photoId: number, width: number) => string): StoryPhoto {
  const photo = toPhoto(row)
  return {
    id: photo.id,
    caption: photo.caption,
    credit: photo.credit,
    altText: photo.altText,
    width: photo.width,
    height: photo.height,
    variants: photo.variants.map(v => ({ width: v.width, height: v.height, url: urlFor ? urlFor(photo.id, v.width) : v.url })),
    ready: photo.status === 'ready',
  }
}
