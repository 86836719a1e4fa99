// The lists: all stories a user may reach, the desk's queue and a writer's own.
import type { DeskQueueItem, MyStoriesResponse, StorySummary } from '#shared/types/stories'
import { STORY_STATE_IDS, type StoryState } from '#shared/types/story-workflow'
import type { CurrentUser } from '#shared/types/users'
import type { Db } from '../../utils/db'
import { type StoryRow, storySummaries, visibleStories } from './stories'

const likeEscaped = (q: string) => `%${q.replace(/[\\%_]/g, c => `\\${c}`)}%`

export async function listStories(db: Db, user: CurrentUser, query: { state?: StoryState, benchTestId?: number, q?: string }): Promise<StorySummary[]> {
  const rows = visibleStories(db, user).select('stories.*').orderBy('stories.updated_at', 'desc').orderBy('stories.id', 'desc').limit(500)
  if (query.state) rows.where('stories.state', query.state)
  if (query.benchTestId) rows.where('stories.bench_test_id', query.benchTestId)
  if (query.q) rows.where('stories.headline', 'like', likeEscaped(query.q))
  return storySummaries(db, await rows as StoryRow[])
}

/** Stories in one desk state, the longest waiting first, with who sent them and open threads. */
export async function deskQueue(db: Db, user: CurrentUser, state: StoryState): Promise<DeskQueueItem[]> {
  const rows = await visibleStories(db, user).where('stories.state', state)
    .orderBy('stories.state_changed_at').orderBy('stories.id')
    .select('stories.*', db.raw('TIMESTAMPDIFF(SECOND, stories.state_changed_at, NOW(3)) AS age_seconds')) as (StoryRow & { age_seconds: number })[]
  if (!rows.length) return []
  const ids = rows.map(r => r.id)
  const [summaries, senders, threads] = await Promise.all([
    storySummaries(db, rows),
    // The newest move into this state says who sent it there.
    db('story_transitions as t').leftJoin('users', 'users.id', 't.user_id')
      .whereIn('t.story_id', ids).where('t.to_state', state)
      .whereRaw('t.id = (SELECT MAX(t2.id) FROM story_transitions t2 WHERE t2.story_id = t.story_id AND t2.to_state = t.to_state)')
      .select('t.story_id', 't.user_id', 'users.display_name') as Promise<{ story_id: number, user_id: number | null, display_name: string | null }[]>,
    db('story_notes').whereIn('story_id', ids).whereNull('parent_id').where('resolved', false)
      .groupBy('story_id').select('story_id', db.raw('COUNT(*) AS n')) as Promise<{ story_id: number, n: number }[]>,
  ])
  return rows.map((row, i) => {
    const sender = senders.find(s => s.story_id === row.id)
    return {
      story: summaries[i]!,
      since: isoTimeRequired(row.state_changed_at),
      ageSeconds: Math.max(0, Number(row.age_seconds)),
      submittedBy: sender?.user_id ? { userId: sender.user_id, displayName: sender.display_name ?? '' } : null,
      openThreads: Number(threads.find(t => t.story_id === row.id)?.n ?? 0),
    }
  })
}

/** Stories the user is a byline of (editors too), with a count per state. */
export async function myStories(db: Db, user: CurrentUser, state?: StoryState): Promise<MyStoriesResponse> {
  const mine = () => db<StoryRow>('stories').join('story_bylines', 'story_bylines.story_id', 'stories.id').where('story_bylines.user_id', user.id)
  const [rows, countRows] = await Promise.all([
    mine().modify((q) => { if (state) q.where('stories.state', state) }).orderBy('stories.updated_at', 'desc').select('stories.*') as Promise<StoryRow[]>,
    mine().groupBy('stories.state').select('stories.state', db.raw('COUNT(*) AS n')) as Promise<{ state: StoryState, n: number }[]>,
  ])
  const counts = Object.fromEntries(STORY_STATE_IDS.map(s => [s, Number(countRows.find(c => c.state === s)?.n ?? 0)])) as Record<StoryState, number>
  return { stories: await storySummaries(db, rows), counts }
}
