// The demo magazine, made the way the desk makes one: over the running server's own
// HTTP API, signed in as the demo writer and editor. Photos are drawn here and
// uploaded (the server sizes them in its photo jobs), captioned and credited; the
// stories are written, sent to the desk, noted, approved, scheduled, published and
// withdrawn through the workflow, so each gets what real use gives it (revisions,
// transitions, e-mails, editions). Only then does the demo clock move the published
// stories' dates back over a season (see `applyDemoClock`): a fresh database would
// otherwise show a whole season published in the same minute.
import type { Knex } from 'knex'
import { DEMO_PASSWORD } from '../../shared/utils/demo-accounts'
import type { Photo, PhotoUploadResult } from '../../shared/types/photos'
import type { Story, StoryResponse, TransitionResponse } from '../../shared/types/stories'
import type { AnalysisResponse } from '../../shared/types/analysis-results'
import { scriptDb } from '../lib/database'
import { DemoClient } from './http'
import { drawPhoto } from './photo-scenes'
import { DEMO_STORIES, type DemoStory } from './stories'

export const DEMO_CO_WRITER = { email: 'bench-writer@example.com', displayName: 'Tobiah Renk' }
// 1280 px covers the hero's widest place on a page (1100 CSS px at desktop width) with
// the same sharpness as 1600 did, for two thirds of the pixels to draw, decode and encode.
const HERO_SIZE = { width: 1280, height: 800 }
const PHOTO_SIZE = { width: 960, height: 600 }

interface Prepared { demo: DemoStory, benchTestId: number, setups: number[], photos: Photo[], story?: Story }

export interface DemoMagazineResult {
  stories: number
  photos: number
  seconds: number
  /** Where the time went: drawing, uploading and writing; the photo jobs' tail; publishing and the clock. */
  phases: { writing: number, waitingForPhotos: number, publishing: number }
}

/** fn over items, at most `limit` at a time; results in the items' order. */
async function atMost<T, R>(limit: number, items: readonly T[], fn: (item: T) => Promise<R>): Promise<R[]> {
  const results: R[] = []
  let next = 0
  const lane = async () => {
    while (next < items.length) {
      const i = next++
      results[i] = await fn(items[i]!)
    }
  }
  await Promise.all(Array.from({ length: Math.min(limit, items.length) }, lane))
  return results
}

/** Whether this database wants the demo magazine: the demo seed ran and no story exists yet. */
export async function demoMagazineWanted(databaseUrl: string): Promise<boolean> {
  if (process.env.PULLSHEET_DEMO_STORIES === '0') return false
  const db = scriptDb(databaseUrl)
  try {
    const writer = await db('users').where({ email: 'writer@example.com' }).first('id')
    const benchTest = await db('bench_tests').where({ slug: DEMO_STORIES[0]!.benchTestSlug }).first('id')
    const story = await db('stories').first('id')
    return Boolean(writer && benchTest && !story)
  }
  finally { await db.destroy() }
}

async function prepare(db: Knex, writer: DemoClient, demo: DemoStory): Promise<Prepared> {
  const benchTest = await db('bench_tests').where({ slug: demo.benchTestSlug }).whereNull('deleted_at').first('id')
  if (!benchTest) throw new Error(`demo seed: no bench test ${demo.benchTestSlug} (run the database seed first)`)
  const benchTestId = Number(benchTest.id)
  const setups = (await db('setups').where({ bench_test_id: benchTestId }).whereNull('deleted_at').orderBy('position').pluck('id') as number[]).map(Number)
  // Each photo goes up while the next one is drawn: drawing holds this process, the
  // upload and the server's sizing do not.
  const uploads: Promise<Photo>[] = []
  for (const [i, shot] of demo.photos.entries()) {
    const size = shot.hero ? HERO_SIZE : PHOTO_SIZE
    const bytes = await drawPhoto(shot.scene, size.width, size.height)
    const form = new FormData()
    form.append('file', new Blob([new Uint8Array(bytes)], { type: 'image/png' }), `${demo.benchTestSlug}-${i + 1}.png`)
    uploads.push((async () => {
      const { photo } = await writer.request<PhotoUploadResult>('POST', `/api/bench-tests/${benchTestId}/photos`, form)
      const { caption, credit, altText } = shot
      return (await writer.patch<{ photo: Photo }>(`/api/photos/${photo.id}`, { version: photo.version, caption, credit, altText })).photo
    })())
  }
  return { demo, benchTestId, setups, photos: await Promise.all(uploads) }
}

async function move(client: DemoClient, story: Story, action: string, extra: Record<string, unknown> = {}): Promise<Story> {
  const res = await client.post<TransitionResponse>(`/api/stories/${story.id}/transitions`, { action, version: story.version, ...extra })
  return res.story
}

/** Writes the story and takes it as far as the desk takes it before publishing. */
async function write(p: Prepared, writer: DemoClient, editor: DemoClient, bylineIds: number[]): Promise<void> {
  const { demo } = p
  const context = { s: p.setups, p: p.photos.map(ph => ph.id) }
  if (demo.check) {
    const analysis = await writer.get<AnalysisResponse>(`/api/bench-tests/${p.benchTestId}/analysis`)
    const wrong = demo.check(analysis, context)
    if (wrong) throw new Error(`demo seed: "${demo.headline}" says something its data does not bear out: ${wrong}`)
  }
  let { story } = await writer.post<StoryResponse>('/api/stories', { benchTestId: p.benchTestId, headline: demo.headline, deck: demo.deck, tags: demo.tags, bylineIds })
  story = (await writer.patch<StoryResponse>(`/api/stories/${story.id}`, { version: story.version, body: demo.body(context), heroPhotoId: p.photos[0]?.id ?? null })).story
  p.story = story
  if (demo.end === 'draft') return
  story = await move(writer, story, 'submit', { note: 'Ready for the desk.' })
  if (demo.end === 'in_review') {
    for (const note of demo.notes ?? []) {
      const thread = await editor.post<{ note: { id: number } }>(`/api/stories/${story.id}/notes`, { body: note.body, anchor: note.anchor })
      if (note.reply) await writer.post(`/api/stories/${story.id}/notes`, { body: note.reply, parentId: thread.note.id })
    }
  }
  else if (demo.end === 'changes_requested') {
    story = await move(editor, story, 'request_changes', { note: demo.moveNote })
  }
  else {
    story = (await editor.get<StoryResponse>(`/api/stories/${story.id}`)).story
    await editor.get(`/api/stories/${story.id}/number-check`)
    story = await move(editor, story, 'approve', { note: 'Numbers check out.' })
  }
  p.story = story
}

/**
 * Waits for the photo jobs; allows 20 s a photo, which a machine busy with other work
 * needs. Their state is read from the database, not through the API: fourteen gallery
 * requests four times a second took CPU from the very jobs being waited for (about
 * a fifth of the server's share of the seed, measured on 2026-12-04).
 */
async function photosReady(db: Knex, benchTestIds: number[], count: number): Promise<number> {
  const until = Date.now() + 60_000 + count * 20_000
  for (;;) {
    const photos = await db('photos').whereIn('bench_test_id', benchTestIds).select('id', 'status', 'failure_reason') as { id: number, status: string, failure_reason: string | null }[]
    const failed = photos.find(ph => ph.status === 'failed')
    if (failed) throw new Error(`demo seed: photo ${failed.id} could not be sized: ${failed.failure_reason}`)
    if (photos.every(ph => ph.status === 'ready')) return photos.length
    if (Date.now() > until) throw new Error('demo seed: photos were not sized in time')
    await new Promise(r => setTimeout(r, 250))
  }
}

/** Goes live (or on the schedule, or live and then withdrawn), oldest first. */
async function finish(p: Prepared, editor: DemoClient, now: Date): Promise<void> {
  let story = p.story!
  if (p.demo.end === 'scheduled') {
    const tomorrow = new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate() + 1, 13, 0, 0))
    p.story = await move(editor, story, 'schedule', { scheduledAt: tomorrow.toISOString() })
    return
  }
  if (p.demo.end !== 'published' && p.demo.end !== 'withdrawn') return
  story = await move(editor, story, 'publish_now')
  if (p.demo.end === 'withdrawn') story = await move(editor, story, 'withdraw', { note: p.demo.moveNote })
  p.story = story
}

/**
 * The demo clock: a published story's publication and its trail of transitions are
 * moved back to `publishedDaysAgo` days before now (at 14:00 UTC), keeping their order;
 * a withdrawn one was withdrawn three days after it went out. A story still on the
 * desk last moved `movedHoursAgo` hours ago. Only the demo seed does this, right after
 * the workflow ran and before anyone reads a page.
 */
async function applyDemoClock(db: Knex, prepared: Prepared[], now: Date): Promise<void> {
  const hour = 3600_000
  for (const p of prepared) {
    const { publishedDaysAgo: days, movedHoursAgo } = p.demo
    if (!p.story || (days === undefined && movedHoursAgo === undefined)) continue
    const anchor = days !== undefined
      ? new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate() - days, 14, 0, 0))
      : new Date(now.getTime() - movedHoursAgo! * hour)
    await db.transaction(async (trx) => {
      const moves = await trx('story_transitions').where({ story_id: p.story!.id }).orderBy('id').select('id', 'to_state') as { id: number, to_state: string }[]
      // The move the anchor stands for: going live, or the last one for the desk's stories.
      const anchorMove = days !== undefined ? moves.findIndex(m => m.to_state === 'published') : moves.length - 1
      for (const [i, m] of moves.entries()) {
        const at = i <= anchorMove ? anchor.getTime() - (anchorMove - i) * 20 * hour : anchor.getTime() + 3 * 24 * hour
        await trx('story_transitions').where({ id: m.id }).update({ created_at: new Date(at) })
      }
      const last = p.demo.end === 'withdrawn' ? new Date(anchor.getTime() + 3 * 24 * hour) : anchor
      await trx('stories').where({ id: p.story!.id }).update({
        ...(days !== undefined ? { published_at: anchor } : {}),
        state_changed_at: last,
        updated_at: last,
        created_at: new Date(anchor.getTime() - (anchorMove + 2) * 20 * hour),
      })
    })
  }
}

/** Builds the whole demo magazine on a running server; `baseUrl` is the server's. */
export async function buildDemoMagazine(baseUrl: string, databaseUrl: string, now = new Date()): Promise<DemoMagazineResult> {
  const started = Date.now()
  const db = scriptDb(databaseUrl)
  try {
    const admin = await DemoClient.signedIn(baseUrl, 'admin@example.com', DEMO_PASSWORD)
    const coWriter = await db('users').where({ email: DEMO_CO_WRITER.email }).first('id')
      ?? (await admin.post<{ user: { id: number } }>('/api/users', { ...DEMO_CO_WRITER, role: 'writer', password: DEMO_PASSWORD })).user
    const writer = await DemoClient.signedIn(baseUrl, 'writer@example.com', DEMO_PASSWORD)
    const editor = await DemoClient.signedIn(baseUrl, 'editor@example.com', DEMO_PASSWORD)
    const writerId = (await writer.get<{ user: { id: number } }>('/api/auth/me')).user.id

    // A few stories at a time: while one draws its photos, others wait on the server.
    const prepared = await atMost(3, DEMO_STORIES, async (demo) => {
      const p = await prepare(db, writer, demo)
      await write(p, writer, editor, p.demo.coByline ? [writerId, Number(coWriter.id)] : [writerId])
      return p
    })
    const written = Date.now()
    const photos = await photosReady(db, [...new Set(prepared.map(p => p.benchTestId))], prepared.reduce((n, p) => n + p.photos.length, 0))
    const sized = Date.now()
    const oldestFirst = [...prepared].sort((a, b) => (b.demo.publishedDaysAgo ?? -1) - (a.demo.publishedDaysAgo ?? -1))
    for (const p of oldestFirst) await finish(p, editor, now)
    await applyDemoClock(db, prepared, now)
    const seconds = (ms: number) => ms / 1000
    return { stories: prepared.length, photos, seconds: seconds(Date.now() - started), phases: { writing: seconds(written - started), waitingForPhotos: seconds(sized - written), publishing: seconds(Date.now() - sized) } }
  }
  finally { await db.destroy() }
}
