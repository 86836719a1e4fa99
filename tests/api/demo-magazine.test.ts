// The demo magazine (scripts/demo/magazine.ts) built as `npm start` builds it, into
// its own database and bucket behind its own app server, so the other API tests'
// data is never touched: at least eight published stories over three engine
// families and five part types, each with a hero and a gallery of sized, captioned
// photos; one story in every desk state; the withdrawn one answers 410.
import type { ChildProcess } from 'node:child_process'
import { loadavg } from 'node:os'
import { join } from 'node:path'
import { CreateBucketCommand, S3Client } from '@aws-sdk/client-s3'
import type { Knex } from 'knex'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { buildDemoMagazine, type DemoMagazineResult } from '../../scripts/demo/magazine'
import { startApp } from '../../scripts/lib/app'
import { scriptDb } from '../../scripts/lib/database'
import { localEnv, ROOT, serverEnv } from '../../scripts/lib/env'
import { mariadbBinaries } from '../../scripts/lib/mariadb'
import { killGroup, run } from '../../scripts/lib/proc'

const env = localEnv('test')
const PORT = env.app.port + 7
const BASE = `http://127.0.0.1:${PORT}`
const NAME = 'pullsheet_demo_magazine'
const BUCKET = 'pullsheet-demo-magazine'
const url = serverEnv(env).DATABASE_URL!.replace(/\/pullsheet$/, `/${NAME}`)
let app: ChildProcess | undefined
let db: Knex
let result: DemoMagazineResult

async function asRoot(sql: string): Promise<void> {
  await run(mariadbBinaries().client, ['--no-defaults', `--socket=${env.db.socket}`, '-uroot'], { input: sql, quiet: true })
}

beforeAll(async () => {
  await asRoot(`DROP DATABASE IF EXISTS \`${NAME}\`;
    CREATE DATABASE \`${NAME}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;
    GRANT ALL PRIVILEGES ON \`${NAME}\`.* TO '${env.db.user}'@'127.0.0.1';`)
  const s3 = new S3Client({ endpoint: `http://127.0.0.1:${env.s3.port}`, region: 'us-east-1', forcePathStyle: true, credentials: { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' } })
  await s3.send(new CreateBucketCommand({ Bucket: BUCKET })).catch((error: { name?: string }) => {
    if (error.name !== 'BucketAlreadyOwnedByYou' && error.name !== 'BucketAlreadyExists') throw error
  })
  const started = Date.now()
  // Knex loads .ts migrations only under tsx, as npm start and npm test do.
  const dbScript = (command: string) => run(join(ROOT, 'node_modules', '.bin', 'tsx'), ['scripts/db.ts', command], {
    cwd: ROOT,
    quiet: true,
    env: { ...process.env, DATABASE_URL: url, PULLSHEET_DEMO_STORIES: '1' }, // the test run turns the demo off elsewhere
  })
  await dbScript('migrate')
  await dbScript('seed')
  // Its mail goes nowhere: the other tests read the shared catcher for the demo accounts.
  app = await startApp(env, { DATABASE_URL: url, S3_BUCKET: BUCKET, BASE_URL: BASE, SMTP_URL: 'smtp://127.0.0.1:9', PHOTO_POLL_MS: '200', PHOTO_WORKERS: '2' }, PORT) // as npm start runs it
  const seeded = Date.now()
  result = await buildDemoMagazine(BASE, url, new Date())
  console.log(`demo magazine: ${result.stories} stories, ${result.photos} photos in ${result.seconds.toFixed(1)} s (writing ${result.phases.writing.toFixed(1)} s, waiting for photo sizing ${result.phases.waitingForPhotos.toFixed(1)} s, publishing ${result.phases.publishing.toFixed(1)} s; seed and server start before it ${((seeded - started) / 1000).toFixed(1)} s, load average ${loadavg()[0]!.toFixed(1)})`)
  db = scriptDb(url)
}, 900_000) // minutes on a machine shared with other work: it sizes 27 photos

afterAll(async () => {
  if (app) await killGroup(app)
  await db?.destroy()
  await asRoot(`DROP DATABASE IF EXISTS \`${NAME}\`;`)
})

describe('the demo magazine', () => {
  it('has a story in every desk state, and the in-review one carries notes', async () => {
    const rows = await db('stories').select('state').count({ n: '*' }).groupBy('state') as { state: string, n: number }[]
    const byState = Object.fromEntries(rows.map(r => [r.state, Number(r.n)]))
    expect(byState.published).toBeGreaterThanOrEqual(8)
    for (const state of ['draft', 'in_review', 'changes_requested', 'approved', 'scheduled', 'withdrawn']) expect(byState[state], state).toBeGreaterThanOrEqual(1)
    const inReview = await db('stories').where({ state: 'in_review' }).pluck('id')
    expect(Number((await db('story_notes').whereIn('story_id', inReview).count({ n: '*' }).first())!.n)).toBeGreaterThanOrEqual(2)
    const scheduled = await db('stories').where({ state: 'scheduled' }).first('scheduled_at')
    const hoursAhead = (new Date(scheduled.scheduled_at).getTime() - Date.now()) / 3600_000
    expect(hoursAhead).toBeGreaterThan(0)
    expect(hoursAhead).toBeLessThanOrEqual(48)
    expect(result.stories).toBe(Object.values(byState).reduce((a, b) => a + b, 0))
  })

  it('publishes over three engine families and five part types, spread over a season', async () => {
    const published = await db('stories').where({ state: 'published' }).select('engine_family', 'part_type', 'published_at')
    expect(new Set(published.map(s => s.engine_family)).size).toBeGreaterThanOrEqual(3)
    expect(new Set(published.map(s => s.part_type)).size).toBeGreaterThanOrEqual(5)
    const times = published.map(s => new Date(s.published_at).getTime())
    expect((Math.max(...times) - Math.min(...times)) / 86_400_000).toBeGreaterThanOrEqual(60)
    expect(Math.max(...times)).toBeLessThan(Date.now())
  })

  it('gives every published story a hero, a gallery, figures and the cautions; every photo sized and described', async () => {
    const stories = await db('stories').where({ state: 'published' }).select('id', 'slug', 'hero_photo_id', 'body')
    for (const story of stories) {
      expect(story.hero_photo_id, story.slug).not.toBeNull()
      expect(story.body, story.slug).toMatch(/::gallery\{ids="\d+,\d+/)
      expect(story.body, story.slug).toContain('::cautions')
      expect(story.body, story.slug).toContain('::results-table')
      expect(story.body, story.slug).toMatch(/::(pull-graph|gain-graph)/)
      const photos = await db('story_photos').join('photos', 'photos.id', 'story_photos.photo_id').where('story_photos.story_id', story.id)
        .select('photos.status', 'photos.caption', 'photos.credit', 'photos.alt_text', 'photos.variants')
      expect(photos.length, story.slug).toBeGreaterThanOrEqual(3)
      for (const photo of photos) {
        expect(photo.status).toBe('ready')
        expect(photo.caption && photo.credit && photo.alt_text).toBeTruthy()
      }
    }
    const page = await fetch(`${BASE}/stories/${stories[0]!.slug}`, { headers: { accept: 'text/html' } })
    expect(page.status).toBe(200)
  })

  it('quotes the cam test\'s day (plan against what happened) in its story, as frozen in the edition', async () => {
    const story = await db('stories').join('bench_tests', 'bench_tests.id', 'stories.bench_test_id')
      .where('bench_tests.slug', 'three-camshafts-in-a-5-7-l-pushrod-v8').first('stories.slug', 'stories.body')
    expect(story.body).toContain('::day-report')
    const res = await fetch(`${BASE}/api/magazine/stories/${story.slug}`, { headers: { accept: 'application/json' } })
    const view = await res.json() as { figures: { dayReport: { summary: string, rows: unknown[] } } }
    expect(view.figures.dayReport.rows).toHaveLength(4)
    expect(view.figures.dayReport.summary).toBe('4 of 4 planned setups tested, 12 pulls made of 12 planned. Swaps took 82 minutes on average (214 cam 82, 226 cam 71, 238 cam 94).')
  })

  it('answers 410 for the withdrawn story', async () => {
    const withdrawn = await db('stories').where({ state: 'withdrawn' }).first('slug')
    const res = await fetch(`${BASE}/api/magazine/stories/${withdrawn.slug}`, { headers: { accept: 'application/json' } })
    expect(res.status).toBe(410)
  })
})
