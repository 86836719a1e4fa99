import type { Db } from '../../utils/db'
import { rolesAtLeast } from '#shared/accounts/roles'
import type { CurrentUser } from '#shared/types/users'
import { photoInPublishedStory } from '../stories/photos'
import { visibleBenchTests } from '../workspace/bench-test-access'

export interface PhotoRecord {
  id: number
  bench_test_id: number
  story_id: number | null
  status: 'pending' | 'processing' | 'ready' | 'failed'
  failure_reason: string | null
  storage_prefix: string
  original_key: string
  mime: string
  original_name: string
  bytes: number
  sha256: string
  width: number
  height: number
  orientation: number
  variants: string | null
  caption: string
  credit: string
  alt_text: string
  position: number
  is_hero: number | boolean
  version: number
  uploaded_by: number
  processed_at: Date | string | null
  created_at: Date | string
  updated_at: Date | string
}

/** Photos this user may reach: those of the bench tests in their scope (visibleBenchTests). */
export function visiblePhotos(db: Db, user: CurrentUser) {
  return visibleBenchTests(db, user)
    .join('photos', 'photos.bench_test_id', 'bench_tests.id')
    .select<PhotoRecord[]>('photos.*')
}

/** The photo, or 404 when it does not exist or its bench test is not this user's to reach. */
export async function requirePhoto(db: Db, user: CurrentUser, id: number): Promise<PhotoRecord> {
  const row = await visiblePhotos(db, user).where('photos.id', id).first()
  if (!row) notFound('No such photo.')
  return row as PhotoRecord
}

/** A photo anyone may see: one a published story uses (hero or in its body). */
export async function photoIsPublic(db: Db, photoId: number): Promise<boolean> {
  return photoInPublishedStory(db, photoId)
}

/**
 * For the image route: the photo with who may see it. The desk (writers on their
 * own bench tests, editors and admins) sees everything including the original;
 * anyone else sees the web sizes of a public photo; otherwise null (404).
 */
export async function findReadablePhoto(db: Db, user: CurrentUser | null, id: number): Promise<{ row: PhotoRecord, desk: boolean } | null> {
  if (user && rolesAtLeast('writer').includes(user.role)) {
    const row = await visiblePhotos(db, user).where('photos.id', id).first()
    if (row) return { row: row as PhotoRecord, desk: true }
  }
  if (!await photoIsPublic(db, id)) return null
  const row = await db<PhotoRecord>('photos').where({ id }).first()
  return row ? { row, desk: false } : null
}
