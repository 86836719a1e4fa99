// Moving a story through the workflow. The rules are the shared table
// (shared/types/story-workflow.ts); this file enforces them and runs each move in
// one transaction: the row, the audit, a revision, the mail and any job.
import type { Knex } from 'knex'
import type { Db } from '../../utils/db'
import type { GuardRefusalData, Story, StoryTransition, TransitionInput, WrongStateData } from '#shared/types/stories'
import { STORY_GUARDS, type StoryAction, type StoryGuard, type StoryState, type StoryTransitionRule } from '#shared/types/story-workflow'
import { allowedActions, decideTransition, storyStateLabel } from '#shared/stories/workflow'
import type { CurrentUser } from '#shared/types/users'
import { figureProblems } from '#shared/utils/story-body'
import { mailStateChange } from './mail'
import { createEdition, publishLatestEdition } from '../stories/editions'
import { usedPhotosWithoutAltText } from '../stories/photos'
import { writeRevision } from '../stories/revisions'
import { getStory, requireStoryRow, storyById, storyDto, type StoryRow, storyTransaction } from '../stories/stories'

export const PUBLISH_JOB = 'publish-story'

interface TransitionRow { id: number, story_id: number, action: string, from_state: StoryState, to_state: StoryState, user_id: number | null, display_name: string | null, note: string, scheduled_at: Date | string | null, created_at: Date | string }

function toTransition(row: TransitionRow): StoryTransition {
  return {
    id: Number(row.id),
    storyId: row.story_id,
    action: row.action as StoryTransition['action'],
    fromState: row.from_state,
    toState: row.to_state,
    by: row.user_id === null ? null : { userId: row.user_id, displayName: row.display_name ?? '' },
    note: row.note,
    scheduledAt: isoTime(row.scheduled_at),
    at: isoTimeRequired(row.created_at),
  }
}

function transitionQuery(db: Db) {
  return db('story_transitions').leftJoin('users', 'users.id', 'story_transitions.user_id')
    .select('story_transitions.*', 'users.display_name')
}

export async function listTransitions(db: Db, user: CurrentUser, storyId: number): Promise<StoryTransition[]> {
  await requireStoryRow(db, user, storyId)
  const rows = await transitionQuery(db).where('story_transitions.story_id', storyId).orderBy('story_transitions.id') as TransitionRow[]
  return rows.map(toTransition)
}

function refuse(guard: StoryGuard, message: string, extra: Partial<GuardRefusalData> = {}): never {
  const data: GuardRefusalData = { guard, message, ...extra }
  throw httpError(422, message, data)
}

/** The guards of a move, in the table's order; the first that fails refuses it (422). */
async function checkGuards(trx: Knex.Transaction, rule: StoryTransitionRule, row: StoryRow, input: TransitionInput): Promise<void> {
  for (const guard of rule.guards) {
    switch (guard) {
      case 'has-content':
        if (!row.headline.trim() || !row.body.trim()) refuse(guard, 'The story needs a headline and a body first.')
        break
      case 'figures-valid': {
        const [setupIds, analysed, photoIds] = await Promise.all([
          trx('setups').where('bench_test_id', row.bench_test_id).whereNull('deleted_at').pluck('id') as Promise<number[]>,
          trx('pulls').join('setups', 'setups.id', 'pulls.setup_id').where('setups.bench_test_id', row.bench_test_id)
            .whereNull('setups.deleted_at').where('pulls.included', true).distinct().pluck('setups.id') as Promise<number[]>,
          trx('photos').where('bench_test_id', row.bench_test_id).pluck('id') as Promise<number[]>,
        ])
        const figures = figureProblems(row.body, { setupIds: new Set(setupIds), analysedSetupIds: new Set(analysed), photoIds: new Set(photoIds) })
        if (figures.length) refuse(guard, `${figures.length} figure${figures.length === 1 ? '' : 's'} in the body cannot be shown: ${figures[0]!.message}`, { figures })
        break
      }
      case 'photos-alt-text': {
        const photos = await usedPhotosWithoutAltText(trx, row)
        if (photos.length) refuse(guard, `Give every photo the story uses alt text first (${photos.length} without).`, { photos })
        break
      }
      case 'number-check-seen':
        if (row.number_check_seen_version !== row.version) refuse(guard, 'Open the number check for this version of the story before approving it.')
        break
      case 'scheduled-time-future': {
        if (!input.scheduledAt) invalidField('scheduledAt', 'Choose when the story goes live.')
        const now = await trx.raw('SELECT NOW(3) AS now') as [{ now: Date }[]]
        if (new Date(input.scheduledAt).getTime() <= new Date(now[0][0]!.now).getTime()) refuse(guard, 'Choose a publication time in the future.')
        break
      }
      default:
        refuse(guard, STORY_GUARDS.find(g => g.id === guard)?.label ?? guard)
    }
  }
}

export interface AppliedMove {
  action: StoryAction | 'scheduled_publish'
  rule: { to: StoryState, mailTo: 'editors' | 'writers', mailSubject: string }
  actor: CurrentUser | null
  note: string
  scheduledAt: string | null
}

/**
 * Writes one change of state on a locked row: the story, the audit row, a state
 * revision, the mail, the publishing job, and on going live the end of preview links.
 */
export async function applyMove(trx: Knex.Transaction, row: StoryRow, move: AppliedMove): Promise<number> {
  const to = move.rule.to
  const patch: Record<string, unknown> = {
    state: to,
    state_changed_at: trx.raw('NOW(3)'),
    version: trx.raw('version + 1'),
    scheduled_at: to === 'scheduled' ? new Date(move.scheduledAt!) : null,
  }
  // A correction keeps the date the story first went live.
  if (to === 'published' && row.state !== 'published') patch.published_at = trx.raw('NOW(3)')
  const updated = await trx('stories').where({ id: row.id, version: row.version }).update(patch)
  if (!updated) throw new Error(`story ${row.id} changed under its row lock`)
  const [transitionId] = await trx('story_transitions').insert({
    story_id: row.id,
    action: move.action,
    from_state: row.state,
    to_state: to,
    user_id: move.actor?.id ?? null,
    note: move.note,
    scheduled_at: to === 'scheduled' ? new Date(move.scheduledAt!) : null,
  })
  // The edition: frozen on approval, put live on publishing; a correction is both at once.
  if (move.action === 'approve') await createEdition(trx, row, move.actor?.id ?? null)
  else if (move.action === 'publish_correction') await createEdition(trx, row, move.actor?.id ?? null, { correctionNote: move.note, publish: true })
  else if (to === 'published') await publishLatestEdition(trx, row, move.actor?.id ?? null)
  const after = await storyById(trx, row.id)
  await writeRevision(trx, after, 'state', move.actor?.id ?? null, `${storyStateLabel(row.state)} to ${storyStateLabel(to)}`)
  await mailStateChange(trx, {
    storyId: row.id,
    slug: row.slug,
    headline: row.headline,
    subject: move.rule.mailSubject,
    to: move.rule.mailTo,
    actor: move.actor ? { id: move.actor.id, name: move.actor.displayName } : null,
    from: row.state,
    toState: to,
    note: move.note,
    scheduledAt: move.scheduledAt,
  })
  if (to === 'scheduled') {
    await enqueueJob(trx, PUBLISH_JOB, { storyId: row.id, scheduledAt: new Date(move.scheduledAt!).toISOString() }, { runAt: new Date(move.scheduledAt!), maxAttempts: 5 })
  }
  if (to === 'published') {
    await trx('story_preview_tokens').where('story_id', row.id).whereNull('revoked_at').update({ revoked_at: trx.raw('NOW(3)') })
  }
  return Number(transitionId)
}

/** Checks in the documented order: role 403, state 409, version 409, note 400, guards 422. */
export async function runTransition(db: Db, user: CurrentUser, storyId: number, input: TransitionInput): Promise<{ story: Story, transition: StoryTransition }> {
  const transitionId = await storyTransaction(db, async (trx) => {
    const row = await requireStoryRow(trx, user, storyId, { lock: true })
    const own = Boolean(await trx('story_bylines').where({ story_id: storyId, user_id: user.id }).first('user_id'))
    const decision = decideTransition(input.action, row.state, user.role, own)
    if (!decision.ok) {
      if (decision.status === 403) throw httpError(403, decision.message)
      const data: WrongStateData = { state: row.state, allowedActions: allowedActions(row.state, user.role, own) }
      throw httpError(409, decision.message, data)
    }
    if (row.version !== input.version) staleVersion(await storyDto(trx, row, user), 'story')
    const note = input.note?.trim() ?? ''
    if (decision.rule.note === 'required' && !note) invalidField('note', `Say why (${decision.rule.label.toLowerCase()} needs a note).`)
    await checkGuards(trx, decision.rule, row, input)
    return applyMove(trx, row, { action: input.action, rule: decision.rule, actor: user, note, scheduledAt: input.scheduledAt ?? null })
  })
  const [story, row] = await Promise.all([
    getStory(db, user, storyId),
    transitionQuery(db).where('story_transitions.id', transitionId).first() as Promise<TransitionRow>,
  ])
  return { story, transition: toTransition(row) }
}
