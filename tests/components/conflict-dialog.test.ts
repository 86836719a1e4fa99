// The editor's conflict dialog: what it lists of "theirs" against "mine", and that each
// way out says which one it took. Mounted in Nuxt's test environment (happy-dom).
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { describe, expect, it } from 'vitest'
import EditorConflictDialog from '~/components/editor/EditorConflictDialog.vue'

import type { StoryDraft } from '#shared/utils/story-draft'

const mine: StoryDraft = {
  headline: 'My headline', deck: 'Same deck', body: 'First line\nMy second line\n', slug: 'cam-test', heroPhotoId: null,
  tags: ['cams'], engineFamily: 'pushrod-v8', partType: 'camshaft', searchTitle: '', searchDescription: '', bylineIds: [3],
}
const theirs = { ...mine, id: 7, headline: 'Their headline', body: 'First line\nTheir second line\n', bylineIds: [3, 4], updatedAt: '2026-12-01T10:00:00.000Z' }

describe('EditorConflictDialog', () => {
  it('lists each field that differs, yours against theirs, and the body as a diff', async () => {
    const wrapper = await mountSuspended(EditorConflictDialog, { props: { mine: mine as never, theirs: theirs as never } })
    const text = wrapper.text()
    expect(text).toContain('yours "My headline", theirs "Their headline"')
    expect(text).not.toContain('Same deck') // unchanged fields are not listed
    expect(text).toContain('Bylines')
    expect(text).toContain('My second line')
    expect(text).toContain('Their second line')
  })

  it('says which way the writer chose', async () => {
    const wrapper = await mountSuspended(EditorConflictDialog, { props: { mine: mine as never, theirs: theirs as never } })
    await wrapper.get('[data-testid="conflict-keep-mine"]').trigger('click')
    await wrapper.get('[data-testid="conflict-take-theirs"]').trigger('click')
    expect(Object.keys(wrapper.emitted())).toEqual(expect.arrayContaining(['keepMine', 'takeTheirs']))
    expect(wrapper.emitted('keepMine')).toHaveLength(1)
    expect(wrapper.emitted('takeTheirs')).toHaveLength(1)
  })
})
