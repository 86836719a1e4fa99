// The soft editing lock: who has a story open, since when. A heartbeat keeps it;
// without one it lapses after LOCK_EXPIRES_SECONDS. It informs and never blocks a
// save (the version check does that).
import type { Db } from '../../utils/db'
import { LOCK_EXPIRES_SECONDS, type LockResponse, type StoryLock } from '#shared/types/stories'
import type { CurrentUser } from '#shared/types/users'
import { mayEditContent } from '#shared/stories/workflow'
import { requireStoryRow } from './stories'

export interface LockRow { story_id: number, user_id: number, display_name: string, since: Date | string, heartbeat_at: Date | string, expires_at: Date | string }

export function toStoryLock(row: LockRow): StoryLock {
  return {
    userId: row.user_id,
    displayName: row.display_name,
    since: isoTimeRequired(row.since),
    heartbeatAt: isoTimeRequired(row.heartbeat_at),
    expiresAt: isoTimeRequired(row.expires_at),
  }
}

/** Locks still alive on these stories (expired rows are ignored, not deleted). */
export function liveLockRows(db: Db, storyIds: number[]): Promise<LockRow[]> {
  return db('story_locks').join('users', 'users.id', 'story_locks.user_id')
    .whereIn('story_locks.story_id', storyIds)
    .where('story_locks.expires_at', '>', db.raw('NOW(3)'))
    .select('story_locks.*', 'users.display_name') as Promise<LockRow[]>
}

/**
 * Takes the lock or refreshes it; someone else's live lock is only replaced with
 * takeOver. Only someone who may change the story in its state takes it at all: a
 * byline writer looking at a story with the desk (or published) sees who holds it,
 * and asking to take it over is refused (409).
 */
export async function takeStoryLock(db: Db, user: CurrentUser, storyId: number, takeOver = false): Promise<LockResponse> {
  const story = await requireStoryRow(db, user, storyId)
  const own = await db('story_bylines').where({ story_id: storyId, user_id: user.id }).first('user_id')
  if (!mayEditContent(story.state, user.role, Boolean(own))) {
    if (takeOver) throw httpError(409, 'You cannot change this story in its state, so you cannot take over its editing lock.')
    const [current] = await liveLockRows(db, [storyId])
    return { lock: current ? toStoryLock(current) : null, heldByMe: current?.user_id === user.id }
  }
  for (let attempt = 0; ; attempt++) {
    try {
      await db.transaction(async (trx) => {
        // Liveness by the database clock, the one every app server shares.
        const row = await trx('story_locks').where({ story_id: storyId }).forUpdate()
          .first('user_id', trx.raw('expires_at > NOW(3) AS live')) as { user_id: number, live: number } | undefined
        const expires = trx.raw('NOW(3) + INTERVAL ? SECOND', [LOCK_EXPIRES_SECONDS])
        if (!row) {
          await trx('story_locks').insert({ story_id: storyId, user_id: user.id, since: trx.raw('NOW(3)'), heartbeat_at: trx.raw('NOW(3)'), expires_at: expires })
          return
        }
        const live = Number(row.live) === 1
        if (row.user_id === user.id && live) {
          await trx('story_locks').where({ story_id: storyId }).update({ heartbeat_at: trx.raw('NOW(3)'), expires_at: expires })
        }
        else if (!live || takeOver) {
          await trx('story_locks').where({ story_id: storyId }).update({ user_id: user.id, since: trx.raw('NOW(3)'), heartbeat_at: trx.raw('NOW(3)'), expires_at: expires })
        }
      })
      break
    }
    catch (error) {
      // Two first takes at once: the loser reads the winner's row on the next try.
      if (!isDuplicateEntry(error) || attempt >= 2) throw error
    }
  }
  const [lock] = await liveLockRows(db, [storyId])
  return { lock: lock ? toStoryLock(lock) : null, heldByMe: lock?.user_id === user.id }
}

/** Releases the lock if it is this user's. */
export async function releaseStoryLock(db: Db, user: CurrentUser, storyId: number): Promise<LockResponse> {
  await requireStoryRow(db, user, storyId)
  await db('story_locks').where({ story_id: storyId, user_id: user.id }).delete()
  const [lock] = await liveLockRows(db, [storyId])
  return { lock: lock ? toStoryLock(lock) : null, heldByMe: false }
}
