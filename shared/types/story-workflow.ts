// The one table of story states and the actions that move a story between them
// (what it means for a role and a state: shared/stories/workflow.ts), read by the server (which enforces it), the interface (which only offers what
// it allows) and the tests (which are generated from it). Brief: "Story states".
import { z } from 'zod'
import type { Role } from './roles'

export const STORY_STATES = [
  { id: 'draft', label: 'Draft' },
  { id: 'in_review', label: 'In review' },
  { id: 'changes_requested', label: 'Changes requested' },
  { id: 'approved', label: 'Approved' },
  { id: 'scheduled', label: 'Scheduled' },
  { id: 'published', label: 'Published' },
  { id: 'withdrawn', label: 'Withdrawn' },
] as const
export type StoryState = typeof STORY_STATES[number]['id']
export const STORY_STATE_IDS = STORY_STATES.map(s => s.id) as [StoryState, ...StoryState[]]
export const StoryStateSchema = z.enum(STORY_STATE_IDS)

/** Checks a transition makes before it runs; a failed one is 422 with `data.guard`. */
export const STORY_GUARDS = [
  /** Headline and body are not empty. */
  { id: 'has-content', label: 'The story has a headline and a body' },
  /** Every figure in the body parses and names setups and photos of the story's bench test. */
  { id: 'figures-valid', label: 'Every figure names setups and photos that exist' },
  /** The hero photo and every photo placed in the body have alt text. */
  { id: 'photos-alt-text', label: 'Every photo used has alt text' },
  /** An editor opened the number check for the version being approved. */
  { id: 'number-check-seen', label: 'The number check was seen for this version' },
  /** The body carries `scheduledAt`, later than now. */
  { id: 'scheduled-time-future', label: 'The publication time is in the future' },
] as const
export type StoryGuard = typeof STORY_GUARDS[number]['id']

/** Who gets an e-mail when a transition runs (never the person who made it). */
export type StoryMailTo = 'editors' | 'writers'

export interface StoryTransitionRule {
  action: StoryAction
  /** Button label in the interface. */
  label: string
  from: readonly StoryState[]
  to: StoryState
  /** Roles that may run it on any story they can reach. */
  roles: readonly Role[]
  /** Roles that may run it only on a story they are a byline of. */
  ownStoryRoles: readonly Role[]
  guards: readonly StoryGuard[]
  /** Whether the body's `note` is required, optional or ignored. */
  note: 'required' | 'optional'
  mailTo: StoryMailTo
  /** Subject line of the e-mail; the story's headline is appended. */
  mailSubject: string
}

/** Roles that move stories past review and may always change the text. */
export const EDITOR_ROLES: readonly Role[] = ['editor', 'admin']

export const STORY_ACTIONS = ['submit', 'request_changes', 'approve', 'schedule', 'unschedule', 'publish_now', 'withdraw', 'reopen', 'publish_correction'] as const
export type StoryAction = typeof STORY_ACTIONS[number]
export const StoryActionSchema = z.enum(STORY_ACTIONS)

/** Brief: a writer moves own drafts to review; only editors move stories past review. */
export const STORY_TRANSITIONS: readonly StoryTransitionRule[] = [
  { action: 'submit', label: 'Send to the desk', from: ['draft', 'changes_requested'], to: 'in_review', roles: EDITOR_ROLES, ownStoryRoles: ['writer'], guards: ['has-content', 'figures-valid', 'photos-alt-text'], note: 'optional', mailTo: 'editors', mailSubject: 'Story sent for review' },
  { action: 'request_changes', label: 'Ask for changes', from: ['in_review', 'approved'], to: 'changes_requested', roles: EDITOR_ROLES, ownStoryRoles: [], guards: [], note: 'required', mailTo: 'writers', mailSubject: 'Changes asked for' },
  { action: 'approve', label: 'Approve', from: ['in_review'], to: 'approved', roles: EDITOR_ROLES, ownStoryRoles: [], guards: ['has-content', 'figures-valid', 'photos-alt-text', 'number-check-seen'], note: 'optional', mailTo: 'writers', mailSubject: 'Story approved' },
  { action: 'schedule', label: 'Schedule', from: ['approved'], to: 'scheduled', roles: EDITOR_ROLES, ownStoryRoles: [], guards: ['scheduled-time-future'], note: 'optional', mailTo: 'writers', mailSubject: 'Story scheduled' },
  { action: 'unschedule', label: 'Take off the schedule', from: ['scheduled'], to: 'approved', roles: EDITOR_ROLES, ownStoryRoles: [], guards: [], note: 'optional', mailTo: 'writers', mailSubject: 'Story taken off the schedule' },
  { action: 'publish_now', label: 'Publish now', from: ['approved', 'scheduled'], to: 'published', roles: EDITOR_ROLES, ownStoryRoles: [], guards: ['has-content', 'figures-valid', 'photos-alt-text'], note: 'optional', mailTo: 'writers', mailSubject: 'Story published' },
  { action: 'withdraw', label: 'Withdraw', from: ['published'], to: 'withdrawn', roles: EDITOR_ROLES, ownStoryRoles: [], guards: [], note: 'required', mailTo: 'writers', mailSubject: 'Story withdrawn' },
  // A published story's text or data changed: the editor approves the new edition and
  // it replaces the one readers see at once, with a dated note of what changed.
  { action: 'publish_correction', label: 'Publish a correction', from: ['published'], to: 'published', roles: EDITOR_ROLES, ownStoryRoles: [], guards: ['has-content', 'figures-valid', 'photos-alt-text', 'number-check-seen'], note: 'required', mailTo: 'writers', mailSubject: 'Correction published' },
  { action: 'reopen', label: 'Back to draft', from: ['withdrawn'], to: 'draft', roles: EDITOR_ROLES, ownStoryRoles: [], guards: [], note: 'optional', mailTo: 'writers', mailSubject: 'Story back to draft' },
]

/**
 * The one transition no person makes: the publishing job moves a scheduled story
 * live at its time (server/plugins/publish-worker.ts). Logged with no user.
 */
export const SCHEDULED_PUBLISH = { from: 'scheduled', to: 'published', mailTo: 'writers', mailSubject: 'Story published' } as const satisfies { from: StoryState, to: StoryState, mailTo: StoryMailTo, mailSubject: string }

export type TransitionRefusal = { ok: true, rule: StoryTransitionRule } | { ok: false, status: 403 | 409, message: string }
