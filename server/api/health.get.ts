async function databaseReachable(): Promise<boolean> {
  try {
    await useDb().raw('SELECT 1')
    return true
  }
  catch { return false }
}

/** Public and secret-free: which part is down, nothing more. */
export default defineEventHandler(async (event) => {
  const [database, storage, mail] = await Promise.all([databaseReachable(), storageReachable(), mailReachable()])
  const parts = { database: database ? 'ok' : 'unreachable', storage: storage ? 'ok' : 'unreachable', mail: mail ? 'ok' : 'unreachable' } as const
  const down = Object.entries(parts).filter(([, state]) => state !== 'ok').map(([name]) => name)
  if (down.length) setResponseStatus(event, 503, `Unavailable: ${down.join(', ')}`)
  return { status: down.length ? 'unavailable' : 'ok', ...parts, down }
})
