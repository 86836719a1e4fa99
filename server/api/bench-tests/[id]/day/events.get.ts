import { liveMark, watchLiveMark } from '~~/server/services/workspace/live-marks'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'
// Server-sent events for the dyno day view: one "change" event, with the bench test's
// change counter as its id, whenever the counter moves. The browser's EventSource
// reconnects by itself and sends Last-Event-ID; a counter that moved meanwhile is sent
// at once, so a watcher never misses a change (it re-reads the day view on any event).
const HEARTBEAT_MS = 20_000

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, BenchTestParams)
  if (!(getRequestHeader(event, 'accept') ?? '').includes('text/event-stream')) {
    throw createError({ statusCode: 406, statusMessage: 'Not Acceptable', message: 'This is an event stream: open it with EventSource (Accept: text/event-stream).' })
  }
  const db = useDb()
  const seen = Number(getRequestHeader(event, 'last-event-id') ?? getQuery(event).since ?? Number.NaN)
  const current = await liveMark(db, params.id)
  const stream = createEventStream(event)
  const send = (seq: number) => void stream.push({ id: String(seq), event: 'change', data: JSON.stringify({ seq }) }).catch(() => {})
  const stop = watchLiveMark(useDb, params.id, current, send, Number(process.env.LIVE_POLL_MS ?? 1000))
  const heartbeat = setInterval(() => void stream.push({ event: 'ping', data: '' }).catch(() => {}), HEARTBEAT_MS)
  stream.onClosed(() => {
    clearInterval(heartbeat)
    stop()
  })
  // First message: the retry delay and, for a reconnect that missed something or a first
  // connection, the counter as it is now.
  if (seen !== current) void stream.push({ id: String(current), event: 'change', data: JSON.stringify({ seq: current }), retry: 2000 }).catch(() => {})
  return stream.send()
})
