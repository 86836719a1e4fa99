import type { ChildProcess } from 'node:child_process'
import { readdirSync, readFileSync } from 'node:fs'
import { afterAll, afterEach, describe, expect, it, vi } from 'vitest'
import { startApp } from '../../scripts/lib/app'
import { localEnv } from '../../scripts/lib/env'
import { killGroup } from '../../scripts/lib/proc'
import { closeTestDb, testDb } from '../support/db'
import { Client, DEMO_PASSWORD, signedIn, spareAppPort, testServerExtra } from '../support/http'
import { createBenchTest, makeJpeg, photoTestTimeouts, uploadPhoto, userId, waitForPhoto } from '../support/photos'
import { sleep, until } from '../support/wait'

// Waits for photo sizing: timeouts from the one bound for a loaded machine (tests/support/photos.ts).
vi.setConfig(photoTestTimeouts(1))

// Servers of their own, on a queue of their own (PHOTO_QUEUE), so the main test
// server never takes these jobs; a short lease so a dead server's job comes back fast.
const started: ChildProcess[] = []
afterEach(async () => {
  while (started.length) await killGroup(started.pop()!, 'SIGKILL')
})
afterAll(closeTestDb)

async function server(port: number, settings: Record<string, string>): Promise<{ child: ChildProcess, client: Client }> {
  const extra = testServerExtra()
  const child = await startApp(localEnv('test'), { ...extra, PHOTO_JOB_LEASE_SECONDS: '2', PHOTO_POLL_MS: '200', PULLSHEET_TEST_HOOKS: '1', ...settings }, port)
  started.push(child)
  const client = new Client(`http://127.0.0.1:${port}`)
  const login = await client.post('/api/auth/login', { email: 'writer@example.com', password: DEMO_PASSWORD })
  expect(login.status).toBe(200)
  return { child, client }
}

async function jobOf(kind: string, photoId: number) {
  return testDb()('jobs').where({ kind }).whereRaw('JSON_VALUE(payload, \'$.photoId\') = ?', [photoId]).first()
}

describe('a crash mid-job', () => {
  it('a server killed while its worker sizes a photo: the lease runs out and another server finishes the job', async () => {
    const queue = `crash-${Date.now().toString(36)}`
    const kind = `photo.process:${queue}`
    const desk = await signedIn('writer@example.com')
    const bench = await createBenchTest(await userId(desk), 'Crash while sizing')

    const doomed = await server(spareAppPort(11), { PHOTO_QUEUE: queue, PHOTO_TEST_FAULT: 'hang' })
    const res = await uploadPhoto(doomed.client, bench, await makeJpeg(1000, 700), 'mid-job.jpg')
    expect(res.status).toBe(201)
    const photoId = res.body.photo.id
    const running = await until('the job to be running', async () => {
      const job = await jobOf(kind, photoId)
      return job?.status === 'running' ? job : undefined
    })
    expect(running.attempts).toBe(1)
    // The worker marks the photo just after it claims the job, in its own statement.
    await until('the photo to be marked processing', async () => ((await testDb()('photos').where({ id: photoId }).first()).status === 'processing' ? true : undefined))

    // While the server lives, it renews its lease: a slow job is not taken away.
    await sleep(3000)
    const renewed = await jobOf(kind, photoId)
    expect(renewed.status).toBe('running')
    expect(new Date(renewed.lease_until).getTime()).toBeGreaterThan(new Date(running.lease_until).getTime())

    await killGroup(doomed.child, 'SIGKILL')
    await server(spareAppPort(12), { PHOTO_QUEUE: queue })
    const ready = await waitForPhoto(desk, bench, photoId, p => p.status === 'ready')
    expect(ready.variants.map(v => v.width)).toEqual([480, 960, 1000])
    // The photo row says ready a statement before the job row says done: wait for the job.
    const done = await until('the job to be done', async () => {
      const job = await jobOf(kind, photoId)
      return job?.status === 'done' ? job : undefined
    })
    expect(done).toMatchObject({ status: 'done', attempts: 2 })
  })

  it('a worker thread that dies mid-job: the job is tried again and succeeds', async () => {
    const queue = `exit-${Date.now().toString(36)}`
    const kind = `photo.process:${queue}`
    const desk = await signedIn('writer@example.com')
    const bench = await createBenchTest(await userId(desk), 'Worker dies')

    const flaky = await server(spareAppPort(13), { PHOTO_QUEUE: queue, PHOTO_TEST_FAULT: 'exit-first-try', PHOTO_RETRY_DELAY_SECONDS: '1' })
    const res = await uploadPhoto(flaky.client, bench, await makeJpeg(800, 500), 'worker-dies.jpg')
    const ready = await waitForPhoto(desk, bench, res.body.photo.id, p => p.status === 'ready')
    expect(ready.variants.map(v => v.width)).toEqual([480, 800])
    const job = await until('the job to be done', async () => {
      const row = await jobOf(kind, ready.id)
      return row?.status === 'done' ? row : undefined
    })
    expect(job).toMatchObject({ status: 'done', attempts: 2 })
    expect(job.last_error).toMatch(/stopped unexpectedly \(exit code 70\)/)
  })
})

describe('the sizing child\'s priority', () => {
  // proc(5): field 5 is the process group, field 19 the nice value (counted from 1, after the name in brackets).
  function groupMembers(pgrp: number): { pid: number, nice: number, cmdline: string }[] {
    const members = []
    for (const entry of readdirSync('/proc')) {
      if (!/^\d+$/.test(entry)) continue
      try {
        const stat = readFileSync(`/proc/${entry}/stat`, 'utf8')
        const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ')
        if (Number(fields[2]) !== pgrp) continue
        members.push({ pid: Number(entry), nice: Number(fields[16]), cmdline: readFileSync(`/proc/${entry}/cmdline`, 'utf8').replaceAll('\0', ' ') })
      }
      catch { /* the process ended while we looked */ }
    }
    return members
  }

  it('sizes photos in a child at nice 19 (PHOTO_WORKER_NICE unset) while the server keeps its own priority', async () => {
    const queue = `nice-${Date.now().toString(36)}`
    const desk = await signedIn('writer@example.com')
    const bench = await createBenchTest(await userId(desk), 'Sizing priority')
    const own = await server(spareAppPort(14), { PHOTO_QUEUE: queue, PHOTO_WORKER_IDLE_SECONDS: '120' })
    const res = await uploadPhoto(own.client, bench, await makeJpeg(900, 600), 'priority.jpg')
    expect(res.status).toBe(201)
    await waitForPhoto(desk, bench, res.body.photo.id, p => p.status === 'ready')

    const members = groupMembers(own.child.pid!)
    const sizing = members.filter(m => m.cmdline.includes('photo-worker'))
    const serving = members.find(m => m.pid === own.child.pid)
    expect(sizing.length, members.map(m => m.cmdline).join('\n')).toBeGreaterThan(0)
    for (const child of sizing) expect(child.nice).toBe(19)
    expect(serving!.nice).toBeLessThan(19)
  })
})
