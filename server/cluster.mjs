// The app on several processes of one host: PULLSHEET_PROCESSES copies of the built
// server (index.mjs beside this file) share one listening port through node:cluster,
// whose primary hands each new connection to the next process in turn. Run as
// `node .output/server/cluster.mjs`; with PULLSHEET_PROCESSES unset or 1 it is the
// plain server in this process, with `auto` one process per core.
//
// The processes keep no state another must see (DEVELOPERS.md, Architecture), except
// per-process caches: a process that drops its page cache or site settings tells the
// others through the primary and waits for them (server/utils/sibling-processes.ts),
// so a change is seen by the whole host before its answer goes out, as with one process.
import cluster from 'node:cluster'
import { availableParallelism } from 'node:os'

const setting = process.env.PULLSHEET_PROCESSES ?? '1'
const wanted = setting === 'auto' ? availableParallelism() : Number(setting)
if (!Number.isInteger(wanted) || wanted < 1) {
  console.error(`PULLSHEET_PROCESSES must be a whole number of 1 or more, or "auto" (got "${setting}").`)
  process.exit(1)
}

if (wanted === 1 || cluster.isWorker) {
  await import('./index.mjs')
}
else {
  runPrimary(wanted)
}

function runPrimary(count) {
  // A process that stops within this time of starting did not start (a missing setting,
  // the port taken): the whole server stops with its exit code instead of starting it
  // again and again. One that stops later is replaced.
  const STARTUP_MS = 15_000
  const RELAY_TIMEOUT_MS = 1_000
  let stopping = false
  let exitCode = 0
  const startedAt = new Map()
  const fork = () => {
    const worker = cluster.fork()
    startedAt.set(worker.id, Date.now())
  }
  for (let i = 0; i < count; i++) fork()

  cluster.on('exit', (worker, code, signal) => {
    const age = Date.now() - (startedAt.get(worker.id) ?? 0)
    startedAt.delete(worker.id)
    if (stopping) {
      if (Object.keys(cluster.workers ?? {}).length === 0) process.exit(exitCode)
      return
    }
    if (age < STARTUP_MS) {
      console.error(`app process ${worker.process.pid} stopped ${signal ?? `with code ${code}`} while starting: stopping the server`)
      stop(typeof code === 'number' && code !== 0 ? code : 1)
      return
    }
    console.error(`app process ${worker.process.pid} stopped ${signal ?? `with code ${code}`}: starting another`)
    fork()
  })

  // Relayed drops: { pullsheet: 'drop', kind, arg, id } from one process goes to every
  // other; each answers 'dropped' when done, and the sender hears 'done' once all have
  // (or after RELAY_TIMEOUT_MS: the stories poll catches up with a stuck process).
  const pending = new Map()
  const finish = (key) => {
    const entry = pending.get(key)
    if (!entry) return
    pending.delete(key)
    clearTimeout(entry.timer)
    if (entry.origin.isConnected()) entry.origin.send({ pullsheet: 'done', id: entry.id })
  }
  cluster.on('message', (worker, message) => {
    if (message?.pullsheet === 'drop') {
      const others = Object.values(cluster.workers ?? {}).filter(w => w && w !== worker && w.isConnected())
      const key = `${worker.id}:${message.id}`
      pending.set(key, { origin: worker, id: message.id, left: others.length, timer: setTimeout(() => finish(key), RELAY_TIMEOUT_MS) })
      for (const other of others) other.send({ ...message, from: worker.id })
      if (others.length === 0) finish(key)
    }
    else if (message?.pullsheet === 'dropped') {
      const key = `${message.from}:${message.id}`
      const entry = pending.get(key)
      if (entry && --entry.left <= 0) finish(key)
    }
  })

  function stop(code) {
    if (stopping) return
    stopping = true
    exitCode = code
    const workers = Object.values(cluster.workers ?? {}).filter(Boolean)
    if (workers.length === 0) process.exit(code)
    // Each process shuts down as the single server does (Nitro's graceful shutdown);
    // the primary exits when the last one has.
    for (const worker of workers) worker.process.kill('SIGTERM')
    setTimeout(() => process.exit(code), 35_000).unref()
  }
  process.on('SIGTERM', () => stop(0))
  process.on('SIGINT', () => stop(0))
}
