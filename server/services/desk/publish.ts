// The publishing job: a scheduled story goes live at its time, exactly once. The
// job row is claimed with SKIP LOCKED (one app server gets it); the story row is
// then locked and checked, so a story taken off the schedule, published by hand
// or moved to another time is skipped, and a second job for it finds nothing to do.
import { z } from 'zod'
import type { Db } from '../../utils/db'
import { SCHEDULED_PUBLISH } from '#shared/types/story-workflow'
import { applyMove, PUBLISH_JOB } from './transitions'
import { type StoryRow, storyTransaction } from '../stories/stories'

const PublishPayload = z.object({ storyId: z.number().int().positive(), scheduledAt: z.string() })

export type PublishOutcome = 'published' | 'skipped'

export async function publishScheduledStory(db: Db, payload: unknown): Promise<PublishOutcome> {
  const parsed = PublishPayload.safeParse(payload)
  // A payload this app cannot read will never become readable: nothing to retry.
  if (!parsed.success) return 'skipped'
  const { storyId, scheduledAt } = parsed.data
  return storyTransaction(db, async (trx) => {
    const row = await trx<StoryRow>('stories').where({ id: storyId }).forUpdate().first()
    if (!row || row.state !== 'scheduled' || !row.scheduled_at) return 'skipped'
    if (new Date(row.scheduled_at).getTime() !== new Date(scheduledAt).getTime()) return 'skipped'
    await applyMove(trx, row, { action: 'scheduled_publish', rule: SCHEDULED_PUBLISH, actor: null, note: '', scheduledAt: null })
    return 'published'
  })
}

/** Handlers for runOneJob: the publishing worker (server/plugins/publish-worker.ts) runs these. */
export const publishJobHandlers = (db: Db) => ({
  [PUBLISH_JOB]: async (payload: unknown) => { await publishScheduledStory(db, payload) },
})
