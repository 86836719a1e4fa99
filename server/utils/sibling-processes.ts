// The other processes of this host when the server runs as several (server/cluster.mjs,
// PULLSHEET_PROCESSES). Per-process caches that a change must drop everywhere (the
// page cache and the reader's views, the site settings) tell the others through the
// cluster's primary and wait until they have dropped theirs, so an answer that follows
// a change is fresh whichever process takes the next request. A single process, or
// one of several hosts, has no siblings here: the stories poll and the settings'
// short cache cover other hosts as before.
import cluster from 'node:cluster'

export type SiblingDrop = 'story-cache' | 'site-settings'

interface DropMessage { pullsheet: 'drop', kind: SiblingDrop, arg?: string, id: number, from?: number }
interface DoneMessage { pullsheet: 'done', id: number }

const handlers = new Map<SiblingDrop, (arg?: string) => unknown>()
const waiting = new Map<number, () => void>()
let nextId = 1
let listening = false

function listen(): void {
  if (listening || !cluster.isWorker) return
  listening = true
  process.on('message', (message: DropMessage | DoneMessage | undefined) => {
    if (message?.pullsheet === 'drop') {
      void Promise.resolve()
        .then(() => handlers.get(message.kind)?.(message.arg))
        .catch(() => { /* a failed drop is caught up by the polls */ })
        .finally(() => process.send?.({ pullsheet: 'dropped', id: message.id, from: message.from }))
    }
    else if (message?.pullsheet === 'done') {
      waiting.get(message.id)?.()
    }
  })
}

/** What this process does when a sibling drops `kind` (never re-sent to the others). */
export function onSiblingDrop(kind: SiblingDrop, handler: (arg?: string) => unknown): void {
  handlers.set(kind, handler)
  listen()
}

/** Has every sibling process drop `kind`; resolves when they have (at most a second). */
export function dropInSiblings(kind: SiblingDrop, arg?: string): Promise<void> {
  if (!cluster.isWorker || !process.send) return Promise.resolve()
  listen()
  const id = nextId++
  return new Promise((resolve) => {
    const done = () => {
      clearTimeout(timer)
      waiting.delete(id)
      resolve()
    }
    // The primary answers within its own timeout; this one only guards a lost primary.
    const timer = setTimeout(done, 2_000)
    waiting.set(id, done)
    process.send!({ pullsheet: 'drop', kind, arg, id } satisfies DropMessage)
  })
}
