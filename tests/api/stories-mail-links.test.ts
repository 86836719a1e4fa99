// What the story e-mails say: a published story links its public page (not the editor),
// and a scheduled time is given on the magazine's clock, its time zone a site setting.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { SiteSettingsView } from '#shared/types/site-settings'
import { STORY_PATHS } from '#shared/types/stories'
import { formatTime } from '#shared/utils/time-text'
import { type Client, signedIn } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { DEMO, expectOk, newWriter } from '../support/workspace'
import { createStory, storyBench, storyBody, transition, type StoryBench } from '../support/stories'

afterAll(closeTestDb)

let writer: Awaited<ReturnType<typeof newWriter>>
let editor: Client
let bench: StoryBench

beforeAll(async () => {
  writer = await newWriter()
  editor = await signedIn(DEMO.editor)
  bench = await storyBench(writer.client)
})

async function approvedStory() {
  const story = await createStory(writer.client, bench.benchTestId, { body: storyBody(bench) })
  await testDb()('stories').where('id', story.id).update({ state: 'approved' })
  return story
}

const mailTo = (subject: string) => testDb()('mail_outbox').where({ subject, to_address: writer.email }).first('body_text', 'body_html')

describe('story e-mails', () => {
  it('link the public page when a story is published', async () => {
    const story = await approvedStory()
    expectOk(await transition(editor, story.id, 'publish_now'))
    const { slug } = (await testDb()('stories').where('id', story.id).first('slug'))
    const mail = await mailTo(`Story published: ${story.headline}`)
    expect(mail.body_text).toContain(`Read the published story: `)
    expect(mail.body_text).toContain(STORY_PATHS.public(slug))
    expect(mail.body_text).not.toContain(STORY_PATHS.editor(story.id))
    expect(mail.body_html).toContain(STORY_PATHS.public(slug))
  })

  it('say a scheduled time on the magazine\'s clock, following the time zone setting', async () => {
    const admin = await signedIn(DEMO.admin)
    const read = await admin.get<SiteSettingsView>('/api/admin/settings')
    expectOk(await admin.patch<SiteSettingsView>('/api/admin/settings', { version: read.body.version, timeZone: 'Europe/Berlin' }))
    try {
      // The settings are cached for a few seconds per process.
      await new Promise(r => setTimeout(r, 5_500))
      const story = await approvedStory()
      const at = new Date(Date.now() + 7 * 86_400_000).toISOString()
      expectOk(await transition(editor, story.id, 'schedule', { scheduledAt: at }))
      const mail = await mailTo(`Story scheduled: ${story.headline}`)
      expect(mail.body_text).toContain(`It goes live at ${formatTime(at, 'Europe/Berlin')}.`)
      expect(mail.body_text).toMatch(/ CES?T\./)
    }
    finally {
      const now = await admin.get<SiteSettingsView>('/api/admin/settings')
      await admin.patch('/api/admin/settings', { version: now.body.version, timeZone: read.body.settings.timeZone })
    }
  })
})
