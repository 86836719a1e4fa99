// Notes between the desk and the writers, threaded one level deep: a reply hangs on
// the first note of its thread, and a thread is resolved (or reopened) as a whole.
import type { z } from 'zod'
import type { Db } from '../../utils/db'
import type { CreateNoteBody, NoteListResponse, StoryNote, StoryNoteThread, UpdateNoteBody } from '#shared/types/stories'
import type { Role } from '#shared/types/roles'
import type { CurrentUser } from '#shared/types/users'
import { mailNote } from '../desk/mail'
import { requireStoryRow, storyTransaction } from './stories'

interface NoteRow {
  id: number
  story_id: number
  parent_id: number | null
  author_id: number
  author_name: string
  author_role: Role
  body: string
  anchor: string
  resolved: number | boolean
  resolved_by: number | null
  resolver_name: string | null
  resolved_at: Date | string | null
  edited_at: Date | string | null
  created_at: Date | string
}

function toNote(row: NoteRow): StoryNote {
  return {
    id: Number(row.id),
    storyId: row.story_id,
    parentId: row.parent_id === null ? null : Number(row.parent_id),
    author: { userId: row.author_id, displayName: row.author_name, role: row.author_role },
    body: row.body,
    anchor: row.anchor,
    createdAt: isoTimeRequired(row.created_at),
    editedAt: isoTime(row.edited_at),
    resolved: asBool(row.resolved),
    resolvedBy: row.resolved_by === null ? null : { userId: row.resolved_by, displayName: row.resolver_name ?? '' },
    resolvedAt: isoTime(row.resolved_at),
  }
}

function noteQuery(db: Db, storyId: number) {
  return db('story_notes')
    .join('users as author', 'author.id', 'story_notes.author_id')
    .leftJoin('users as resolver', 'resolver.id', 'story_notes.resolved_by')
    .where('story_notes.story_id', storyId)
    .select('story_notes.*', 'author.display_name as author_name', 'author.role as author_role', 'resolver.display_name as resolver_name')
}

export async function listNotes(db: Db, user: CurrentUser, storyId: number): Promise<NoteListResponse> {
  await requireStoryRow(db, user, storyId)
  const notes = (await noteQuery(db, storyId).orderBy('story_notes.id') as NoteRow[]).map(toNote)
  const threads: StoryNoteThread[] = notes.filter(n => n.parentId === null).map(n => ({ ...n, replies: notes.filter(r => r.parentId === n.id) }))
  return { threads, openThreads: threads.filter(t => !t.resolved).length }
}

async function findNote(db: Db, storyId: number, noteId: number): Promise<StoryNote> {
  const row = await noteQuery(db, storyId).where('story_notes.id', noteId).first() as NoteRow | undefined
  if (!row) notFound('No such note on this story.')
  return toNote(row)
}

export async function addNote(db: Db, user: CurrentUser, storyId: number, input: z.output<typeof CreateNoteBody>): Promise<StoryNote> {
  const id = await storyTransaction(db, async (trx) => {
    const story = await requireStoryRow(trx, user, storyId)
    let threadId: number | null = null
    if (input.parentId !== undefined) {
      const parent = await trx('story_notes').where({ id: input.parentId, story_id: storyId }).first('id', 'parent_id')
      if (!parent) invalidField('parentId', 'That note is not on this story.')
      threadId = Number(parent.parent_id ?? parent.id)
      // Answering a resolved thread opens it again: there is something to read.
      await trx('story_notes').where({ id: threadId }).update({ resolved: false, resolved_by: null, resolved_at: null })
    }
    const [noteId] = await trx('story_notes').insert({ story_id: storyId, parent_id: threadId, author_id: user.id, body: input.body, anchor: input.anchor ?? '' })
    const isByline = Boolean(await trx('story_bylines').where({ story_id: storyId, user_id: user.id }).first('user_id'))
    await mailNote(trx, { storyId, headline: story.headline, author: { id: user.id, name: user.displayName }, authorIsByline: isByline, body: input.body })
    return Number(noteId)
  })
  return findNote(db, storyId, id)
}

/** Resolving works on the thread (a reply's thread is resolved through its first note); text edits only by the author. */
export async function updateNote(db: Db, user: CurrentUser, storyId: number, noteId: number, input: z.output<typeof UpdateNoteBody>): Promise<StoryNote> {
  await requireStoryRow(db, user, storyId)
  const note = await findNote(db, storyId, noteId)
  if (input.body !== undefined) {
    if (note.author.userId !== user.id) throw httpError(403, 'Only the author of a note can change its text.')
    await db('story_notes').where({ id: noteId }).update({ body: input.body, edited_at: db.raw('NOW(3)') })
  }
  const threadId = note.parentId ?? note.id
  if (input.resolved !== undefined) {
    await db('story_notes').where({ id: threadId }).update(input.resolved
      ? { resolved: true, resolved_by: user.id, resolved_at: db.raw('NOW(3)') }
      : { resolved: false, resolved_by: null, resolved_at: null })
    return findNote(db, storyId, threadId)
  }
  return findNote(db, storyId, noteId)
}
