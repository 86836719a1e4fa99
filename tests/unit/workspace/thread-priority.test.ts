// lowerWorkerThreadPriority (server/utils/thread-priority.ts): the pull-check thread
// asks the scheduler to put the server's own thread first (issue 14, item 2). Linux
// keeps a nice value per thread (setpriority(2): PRIO_PROCESS with a thread id sets
// that thread's only), read back here from /proc/thread-self/stat's 19th field.
import { readFileSync } from 'node:fs'
import { Worker } from 'node:worker_threads'
import { describe, expect, it } from 'vitest'
import { checkThreadNice, DEFAULT_CHECK_NICE, lowerWorkerThreadPriority } from '../../../server/utils/thread-priority'

const linux = process.platform === 'linux'

/** This thread's nice value (stat field 19; the fields after the name's closing parenthesis start at field 3). */
function ownNice(): number {
  const stat = readFileSync('/proc/thread-self/stat', 'utf8')
  return Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[16])
}

/** Runs the helper in a fresh worker thread (TypeScript through tsx) and returns what it saw. */
function inWorker(nice: number): Promise<{ set: boolean, nice: number }> {
  const helper = new URL('../../../server/utils/thread-priority.ts', import.meta.url).href
  const code = `
    const { parentPort } = require('node:worker_threads')
    const { readFileSync } = require('node:fs')
    import('tsx/esm/api').then(({ tsImport }) => tsImport(${JSON.stringify(helper)}, ${JSON.stringify(import.meta.url)})).then((m) => {
      const set = m.lowerWorkerThreadPriority(${nice})
      const stat = readFileSync('/proc/thread-self/stat', 'utf8')
      parentPort.postMessage({ set, nice: Number(stat.slice(stat.lastIndexOf(')') + 2).split(' ')[16]) })
    })`
  return new Promise((resolve, reject) => {
    const worker = new Worker(code, { eval: true })
    worker.once('message', (m) => { resolve(m); void worker.terminate() })
    worker.once('error', reject)
  })
}

describe('lowerWorkerThreadPriority', () => {
  it('never touches the main thread (inline checks run there)', () => {
    const before = linux ? ownNice() : 0
    expect(lowerWorkerThreadPriority(19)).toBe(false)
    if (linux) expect(ownNice()).toBe(before)
  })

  it.runIf(linux)('lowers only the worker thread that calls it', async () => {
    const before = ownNice()
    expect(await inWorker(19)).toEqual({ set: true, nice: 19 })
    expect(await inWorker(0)).toEqual({ set: false, nice: before })
    expect(ownNice()).toBe(before)
  }, 30_000)

  it('reads PULL_CHECK_NICE, falling back to 19 for anything out of range', () => {
    expect(checkThreadNice(undefined)).toBe(DEFAULT_CHECK_NICE)
    expect(checkThreadNice('0')).toBe(0)
    expect(checkThreadNice('10')).toBe(10)
    expect(checkThreadNice('-5')).toBe(DEFAULT_CHECK_NICE)
    expect(checkThreadNice('high')).toBe(DEFAULT_CHECK_NICE)
  })
})
