// Who hears about a story's changes, and what they read. Rows go into the outbox
// inside the caller's transaction (enqueueMail escapes every value), so a change
// and its mail commit together and a mail server that is down blocks nothing.
import type { Knex } from 'knex'
import { STORY_PATHS } from '#shared/types/stories'
import type { StoryMailTo, StoryState } from '#shared/types/story-workflow'
import { storyStateLabel } from '#shared/stories/workflow'
import { formatTime } from '#shared/utils/time-text'
import { getSiteSettings } from '../magazine/settings'

interface Recipient { id: number, email: string }

/** Active editors; the admins when the desk has no editor. */
async function editors(trx: Knex.Transaction): Promise<Recipient[]> {
  const active = (role: string) => trx('users').where({ role, disabled: false }).select('id', 'email') as Promise<Recipient[]>
  const list = await active('editor')
  return list.length ? list : active('admin')
}

async function bylineWriters(trx: Knex.Transaction, storyId: number): Promise<Recipient[]> {
  return trx('story_bylines').join('users', 'users.id', 'story_bylines.user_id')
    .where('story_bylines.story_id', storyId).where('users.disabled', false)
    .orderBy('story_bylines.position').select('users.id', 'users.email') as Promise<Recipient[]>
}

/** Editors who took part in this story (notes, state changes); all editors when none did. */
async function storyEditors(trx: Knex.Transaction, storyId: number): Promise<Recipient[]> {
  const involved = await trx('users').where('disabled', false).whereIn('role', ['editor', 'admin'])
    .where(q => q
      .whereIn('id', trx('story_notes').where('story_id', storyId).select('author_id'))
      .orWhereIn('id', trx('story_transitions').where('story_id', storyId).whereNotNull('user_id').select('user_id')))
    .select('id', 'email') as Recipient[]
  return involved.length ? involved : editors(trx)
}

async function recipients(trx: Knex.Transaction, to: StoryMailTo | 'story-editors', storyId: number, actorId: number | null): Promise<Recipient[]> {
  const list = to === 'editors' ? await editors(trx) : to === 'writers' ? await bylineWriters(trx, storyId) : await storyEditors(trx, storyId)
  // Never mail people about what they did themselves.
  return list.filter(r => r.id !== actorId)
}

/** Editors review on the desk's page of the story; writers open it in the editor. */
function storyLink(storyId: number, forEditors: boolean) {
  const path = forEditors ? STORY_PATHS.deskStory(storyId) : STORY_PATHS.editor(storyId)
  return { href: `${appConfig().baseUrl}${path}`, label: 'Open the story' }
}

/** A published story is read where readers read it. */
function publicLink(slug: string) {
  return { href: `${appConfig().baseUrl}${STORY_PATHS.public(slug)}`, label: 'Read the published story' }
}

export interface StateMail {
  storyId: number
  slug: string
  headline: string
  subject: string
  to: StoryMailTo
  actor: { id: number, name: string } | null
  from: StoryState
  toState: StoryState
  note: string
  scheduledAt: string | null
}

export async function mailStateChange(trx: Knex.Transaction, m: StateMail): Promise<number> {
  const people = await recipients(trx, m.to, m.storyId, m.actor?.id ?? null)
  const who = m.actor ? m.actor.name : 'The publishing schedule'
  // The magazine's clock; a recipient's own zone is not known to the server.
  const zone = (await getSiteSettings(trx)).timeZone
  const paragraphs = [
    `${who} moved "${m.headline}" from ${storyStateLabel(m.from)} to ${storyStateLabel(m.toState)}.`,
    ...(m.scheduledAt && m.toState === 'scheduled' ? [`It goes live at ${formatTime(m.scheduledAt, zone)}.`] : []),
    ...(m.note ? [`Note: ${m.note}`] : []),
  ]
  for (const person of people) {
    await enqueueMail(trx, { to: person.email, subject: `${m.subject}: ${m.headline}`, paragraphs, link: m.toState === 'published' ? publicLink(m.slug) : storyLink(m.storyId, m.to === 'editors') })
  }
  return people.length
}

/** A note goes to the other side: a byline writer's to the editors, anyone else's to the bylines. */
export async function mailNote(trx: Knex.Transaction, n: { storyId: number, headline: string, author: { id: number, name: string }, authorIsByline: boolean, body: string }): Promise<number> {
  const people = await recipients(trx, n.authorIsByline ? 'story-editors' : 'writers', n.storyId, n.author.id)
  const excerpt = n.body.length > 2000 ? `${n.body.slice(0, 2000)}...` : n.body
  for (const person of people) {
    await enqueueMail(trx, {
      to: person.email,
      subject: `New note on: ${n.headline}`,
      paragraphs: [`${n.author.name} wrote a note on "${n.headline}":`, excerpt],
      link: storyLink(n.storyId, n.authorIsByline),
    })
  }
  return people.length
}
