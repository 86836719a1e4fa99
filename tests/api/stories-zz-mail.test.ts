// A mail server that is down never blocks a state change: the outbox row waits,
// is retried with backoff and is delivered once the catcher is back.
import { execFileSync, spawn } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { localEnv, ROOT } from '../../scripts/lib/env'
import { portOpen, startDetached, waitFor } from '../../scripts/lib/proc'
import type { Client } from '../support/http'
import { closeTestDb, testDb } from '../support/db'
import { waitForMail } from '../support/mail'
import { DEMO, newWriter } from '../support/workspace'
import { createStory, storyBench, storyBody, transition } from '../support/stories'

afterAll(closeTestDb)

const smtp = localEnv('test').smtp
let writer: Client

beforeAll(async () => {
  writer = (await newWriter()).client
})

/** The pid listening on the test SMTP port (the catcher scripts/lib/services.ts started). */
function catcherPid(): number {
  const out = execFileSync('ss', ['-ltnpH', `sport = :${smtp.port}`], { encoding: 'utf8' })
  const pid = /pid=(\d+)/.exec(out)?.[1]
  if (!pid) throw new Error(`nothing listens on port ${smtp.port}: ${out}`)
  return Number(pid)
}

/** The process running the whole test run: the parent of this vitest's main process. */
function testRunnerPid(): number {
  const stat = readFileSync(`/proc/${process.ppid}/stat`, 'utf8')
  return Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[1])
}

/**
 * Starts the catcher again as scripts/lib/services.ts does, and a small watchdog
 * that stops it when the test run ends (the run's own shutdown only knows the
 * first catcher), so later test files keep their mail and nothing is left behind.
 */
function restartCatcher(): void {
  const catcher = startDetached(process.execPath, ['--import', 'tsx', join(ROOT, 'scripts', 'services', 'mail-catcher.ts')], {
    cwd: ROOT, env: { ...process.env, SMTP_PORT: String(smtp.port), MAIL_DIR: smtp.mailDir }, stdio: 'ignore',
  })
  catcher.unref()
  const watchdog = `const [c, w] = process.argv.slice(1).map(Number); const end = Date.now() + 4 * 3600e3;
    setInterval(() => { let alive = true; try { process.kill(w, 0) } catch { alive = false }
      if (!alive || Date.now() > end) { try { process.kill(-c, 'SIGTERM') } catch {} process.exit(0) } }, 1000)`
  spawn(process.execPath, ['-e', watchdog, String(catcher.pid), String(testRunnerPid())], { detached: true, stdio: 'ignore' }).unref()
}

describe('mail while the SMTP server is down', () => {
  it('keeps the outbox row pending with its error, and delivers it after the catcher comes back', async () => {
    const bench = await storyBench(writer)
    const story = await createStory(writer, bench.benchTestId, { body: storyBody(bench) })

    process.kill(catcherPid(), 'SIGTERM')
    await waitFor('the catcher to stop', async () => !await portOpen(smtp.port), 10_000)

    const moved = await transition(writer, story.id, 'submit')
    expect(moved.status).toBe(200)
    const subject = `Story sent for review: ${story.headline}`
    await waitFor('a failed try', async () => {
      const row = await testDb()('mail_outbox').where({ subject, to_address: DEMO.editor }).first()
      return Boolean(row?.last_error) && Number(row.attempts) >= 1
    }, 10_000)
    const failed = await testDb()('mail_outbox').where({ subject, to_address: DEMO.editor }).first()
    expect(failed.status).toBe('pending')
    expect(failed.last_error).toMatch(/ECONNREFUSED|connect/i)

    restartCatcher()
    await waitFor('the catcher to listen again', () => portOpen(smtp.port), 15_000)
    const mail = await waitForMail(DEMO.editor, new RegExp(`^Story sent for review: ${story.headline}$`), 30_000)
    expect(mail.text).toContain(story.headline)
    const sent = await testDb()('mail_outbox').where({ subject, to_address: DEMO.editor }).first()
    expect(sent.status).toBe('sent')
    expect(Number(sent.attempts)).toBeGreaterThanOrEqual(2)
  })
})
