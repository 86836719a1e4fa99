// Server renders take turns: at most RENDER_CONCURRENCY (2 by default) at once per
// process, the rest wait in line. A render is CPU work, so running ten at once does
// not finish any sooner; it keeps ten renders' worth of objects alive together,
// which made every garbage collection longer and every page wait for all the others
// (docs/bench/reader.md). Two, so one render's database wait is another's turn.
const limit = Math.max(1, Number(process.env.RENDER_CONCURRENCY) || 2)
let running = 0
const waiting: (() => void)[] = []

function release(held: { released: boolean }): void {
  if (held.released) return
  held.released = true
  const next = waiting.shift()
  if (next) next()
  else running--
}

export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('render:before', async ({ event }) => {
    if (running < limit) running++
    else await new Promise<void>(resolve => waiting.push(resolve))
    const held = { released: false }
    event.context.renderTurn = held
    // Whatever way the render ends (answered, thrown, the client gone), the turn passes on.
    event.node.res.once('close', () => release(held))
  })
  nitroApp.hooks.hook('render:response', (_response, { event }) => {
    if (event.context.renderTurn) release(event.context.renderTurn)
  })
  nitroApp.hooks.hook('error', (_error, context) => {
    const turn = context.event?.context.renderTurn
    if (turn) release(turn)
  })
})

declare module 'h3' {
  interface H3EventContext {
    renderTurn?: { released: boolean }
  }
}
