import { describe, expect, it } from 'vitest'
import { ROLES } from '#shared/types/roles'
import { STORY_STATE_IDS, STORY_TRANSITIONS } from '#shared/types/story-workflow'
import { allowedActions, decideTransition, mayEditContent, transitionFor } from '#shared/stories/workflow'

describe('the story workflow table', () => {
  it('follows the brief: draft -> in review -> approved -> scheduled -> published -> withdrawn', () => {
    const path = ['submit', 'approve', 'schedule', 'unschedule', 'publish_now', 'withdraw', 'reopen'] as const
    let state: string = 'draft'
    for (const action of path) {
      const rule = transitionFor(action)
      expect(rule.from, action).toContain(state)
      state = rule.to
    }
    expect(state).toBe('draft')
  })

  it('reaches every state from draft', () => {
    const reached = new Set<string>(['draft'])
    for (let grew = true; grew;) {
      grew = false
      for (const t of STORY_TRANSITIONS) {
        if (t.from.some(f => reached.has(f)) && !reached.has(t.to)) { reached.add(t.to); grew = true }
      }
    }
    expect([...reached].sort()).toEqual([...STORY_STATE_IDS].sort())
  })

  it('lets a writer move only their own drafts to review (brief: Story states)', () => {
    expect(allowedActions('draft', 'writer', true)).toEqual(['submit'])
    expect(allowedActions('changes_requested', 'writer', true)).toEqual(['submit'])
    expect(allowedActions('draft', 'writer', false)).toEqual([])
    for (const state of STORY_STATE_IDS.filter(s => s !== 'draft' && s !== 'changes_requested')) {
      expect(allowedActions(state, 'writer', true), state).toEqual([])
    }
  })

  it('gives readers nothing and editors and admins the same', () => {
    for (const state of STORY_STATE_IDS) {
      expect(allowedActions(state, 'reader', true)).toEqual([])
      expect(allowedActions(state, 'admin', false)).toEqual(allowedActions(state, 'editor', false))
    }
    expect(allowedActions('in_review', 'editor', false)).toEqual(['request_changes', 'approve'])
  })

  it('decides 403 for a role that may never run an action and 409 for the wrong state', () => {
    expect(decideTransition('approve', 'in_review', 'writer', true)).toMatchObject({ ok: false, status: 403 })
    expect(decideTransition('submit', 'published', 'writer', true)).toMatchObject({ ok: false, status: 409 })
    expect(decideTransition('approve', 'draft', 'editor', false)).toMatchObject({ ok: false, status: 409 })
    expect(decideTransition('approve', 'in_review', 'editor', false)).toMatchObject({ ok: true })
  })

  it('asks for the number check before approval and a time before scheduling', () => {
    expect(transitionFor('approve').guards).toContain('number-check-seen')
    expect(transitionFor('schedule').guards).toContain('scheduled-time-future')
    expect(transitionFor('submit').guards).toContain('photos-alt-text')
  })

  it('lets writers edit their own drafts only, and editors always', () => {
    expect(mayEditContent('draft', 'writer', true)).toBe(true)
    expect(mayEditContent('draft', 'writer', false)).toBe(false)
    expect(mayEditContent('in_review', 'writer', true)).toBe(false)
    for (const role of ROLES) expect(mayEditContent('published', role, true)).toBe(role === 'editor' || role === 'admin')
  })
})
