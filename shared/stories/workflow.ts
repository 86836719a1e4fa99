// What the story table (shared/types/story-workflow.ts) means for a role and a state:
// the server enforces it, the interface offers only what it allows.
import type { Role } from '../types/roles'
import {
  EDITOR_ROLES, STORY_STATES, STORY_TRANSITIONS,
  type StoryAction, type StoryState, type StoryTransitionRule, type TransitionRefusal,
} from '../types/story-workflow'

export function storyStateLabel(state: StoryState): string {
  return STORY_STATES.find(s => s.id === state)?.label ?? state
}

export function transitionFor(action: StoryAction): StoryTransitionRule {
  const rule = STORY_TRANSITIONS.find(t => t.action === action)
  if (!rule) throw new RangeError(`unknown story action ${action}`)
  return rule
}

/** Whether this role may ever run the action (on the right story), whatever the state. */
export function roleMayRun(rule: StoryTransitionRule, role: Role, isOwnStory: boolean): boolean {
  return rule.roles.includes(role) || (isOwnStory && rule.ownStoryRoles.includes(role))
}

/** Actions this user may run on a story in this state (guards not yet checked). */
export function allowedActions(state: StoryState, role: Role, isOwnStory: boolean): StoryAction[] {
  return STORY_TRANSITIONS.filter(t => t.from.includes(state) && roleMayRun(t, role, isOwnStory)).map(t => t.action)
}

/** The server's decision before guards: 403 for a role that may never run it, 409 for the wrong state. */
export function decideTransition(action: StoryAction, state: StoryState, role: Role, isOwnStory: boolean): TransitionRefusal {
  const rule = transitionFor(action)
  if (!roleMayRun(rule, role, isOwnStory)) return { ok: false, status: 403, message: `Your role may not ${rule.label.toLowerCase()} this story.` }
  if (!rule.from.includes(state)) return { ok: false, status: 409, message: `A story that is ${storyStateLabel(state).toLowerCase()} cannot be moved by "${rule.label}".` }
  return { ok: true, rule }
}

/** States in which the text may be changed: writers their own drafts, editors always. */
const WRITER_EDITABLE: readonly StoryState[] = ['draft', 'changes_requested']

export function mayEditContent(state: StoryState, role: Role, isOwnStory: boolean): boolean {
  if (EDITOR_ROLES.includes(role)) return true
  return role === 'writer' && isOwnStory && WRITER_EDITABLE.includes(state)
}

/** States from which a preview link may be made or used: everything before going live. */
export function previewAllowed(state: StoryState): boolean {
  return state !== 'published'
}
