// Preview links: an unguessable token that shows a story not yet published as
// readers will see it. Only the SHA-256 is stored; links are revocable, run out,
// and die when the story is published (applyMove revokes them).
import { createHash, randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'
import type { z } from 'zod'
import type { Db } from '../../utils/db'
import { PREVIEW_LINK_LIMITS, STORY_PATHS, type CreatePreviewLinkBody, type CreatedPreviewLink, type PreviewLink, type StoryReaderView } from '#shared/types/stories'
import { previewAllowed } from '#shared/stories/workflow'
import type { CurrentUser } from '#shared/types/users'
import type { PhotoRecord } from '../photos/access'
import { storyReaderView } from './figures'
import { usedPhotoIds } from './photos'
import { requireStoryRow, storyById, type StoryRow } from './stories'

interface PreviewRow {
  id: number
  story_id: number
  label: string
  created_by: number
  creator_name: string
  created_at: Date | string
  expires_at: Date | string
  revoked_at: Date | string | null
  last_used_at: Date | string | null
  expired: number
}

const hashToken = (token: string) => createHash('sha256').update(token).digest('hex')

function toLink(row: PreviewRow): PreviewLink {
  return {
    id: row.id,
    storyId: row.story_id,
    label: row.label,
    createdBy: { userId: row.created_by, displayName: row.creator_name },
    createdAt: isoTimeRequired(row.created_at),
    expiresAt: isoTimeRequired(row.expires_at),
    revokedAt: isoTime(row.revoked_at),
    lastUsedAt: isoTime(row.last_used_at),
    state: row.revoked_at ? 'revoked' : Number(row.expired) ? 'expired' : 'active',
  }
}

function linkQuery(db: Db) {
  return db('story_preview_tokens').join('users', 'users.id', 'story_preview_tokens.created_by')
    .select('story_preview_tokens.*', 'users.display_name as creator_name', db.raw('story_preview_tokens.expires_at <= NOW(3) AS expired'))
}

export async function listPreviewLinks(db: Db, user: CurrentUser, storyId: number): Promise<PreviewLink[]> {
  await requireStoryRow(db, user, storyId)
  const rows = await linkQuery(db).where('story_preview_tokens.story_id', storyId).orderBy('story_preview_tokens.id', 'desc') as PreviewRow[]
  return rows.map(toLink)
}

export async function createPreviewLink(db: Db, user: CurrentUser, storyId: number, input: z.output<typeof CreatePreviewLinkBody>): Promise<CreatedPreviewLink> {
  const story = await requireStoryRow(db, user, storyId)
  if (!previewAllowed(story.state)) throw httpError(409, 'This story is published: readers see it on its own page now.')
  const token = randomBytes(32).toString('base64url')
  // Written and read back in one transaction, as every create here: a saved row always gets its answer.
  const row = await db.transaction(async (trx) => {
    const [id] = await trx('story_preview_tokens').insert({
      story_id: storyId,
      token_hash: hashToken(token),
      label: input.label ?? '',
      created_by: user.id,
      expires_at: trx.raw('NOW(3) + INTERVAL ? HOUR', [input.expiresInHours ?? PREVIEW_LINK_LIMITS.defaultHours]),
    })
    return await linkQuery(trx).where('story_preview_tokens.id', id).first() as PreviewRow
  })
  return { link: toLink(row), token, url: `${appConfig().baseUrl}${STORY_PATHS.preview(token)}` }
}

export async function revokePreviewLink(db: Db, user: CurrentUser, storyId: number, linkId: number): Promise<PreviewLink> {
  await requireStoryRow(db, user, storyId)
  const count = await db('story_preview_tokens').where({ id: linkId, story_id: storyId }).update({ revoked_at: db.raw('COALESCE(revoked_at, NOW(3))') })
  if (!count) notFound('No such preview link on this story.')
  return toLink(await linkQuery(db).where('story_preview_tokens.id', linkId).first() as PreviewRow)
}

/** The story behind a token: 404 when unknown, 410 when revoked, run out or published. */
export async function storyForPreviewToken(db: Db, token: string): Promise<StoryRow> {
  const link = await db('story_preview_tokens').where('token_hash', hashToken(token))
    .first('id', 'story_id', 'revoked_at', db.raw('expires_at <= NOW(3) AS expired'))
  if (!link) notFound('This preview link does not exist.')
  const gone = (message: string) => createError({ statusCode: 410, statusMessage: 'Gone', message })
  if (link.revoked_at) throw gone('This preview link was withdrawn, or the story has been published.')
  if (Number(link.expired)) throw gone('This preview link has run out. Ask the desk for a new one.')
  const story = await storyById(db, link.story_id)
  if (!previewAllowed(story.state)) throw gone('This story has been published.')
  await db('story_preview_tokens').where('id', link.id).update({ last_used_at: db.raw('NOW(3)') })
  return story
}

/** The page a preview shows; its photos are served through the token too (they are not public yet). */
export async function previewView(db: Db, token: string): Promise<StoryReaderView> {
  const story = await storyForPreviewToken(db, token)
  return storyReaderView(db, story, { preview: true, photoUrl: (photoId, width) => `/api/preview/${token}/photos/${photoId}/${width}` })
}

/** A photo of the previewed story, only when the story uses it. */
export async function previewPhoto(db: Db, token: string, photoId: number): Promise<PhotoRecord> {
  const story = await storyForPreviewToken(db, token)
  const used = await usedPhotoIds(db, story)
  if (!used.includes(photoId)) notFound('No such photo in this story.')
  return (await db<PhotoRecord>('photos').where({ id: photoId }).first())!
}

/** The token from the route; anything that cannot be one is simply not found. */
export function previewTokenParam(event: H3Event): string {
  const token = getRouterParam(event, 'token') ?? ''
  if (!/^[\w-]{32,100}$/.test(token)) notFound('This preview link does not exist.')
  return token
}
