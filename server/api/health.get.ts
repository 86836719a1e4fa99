import { probeMail, probeStorage } from '~~/server/utils/health-probes'

async function databaseReachable(): Promise<boolean> {
  try {
    await useDb().raw('SELECT 1')
    return true
  }
  catch { return false }
}

/**
 * Public and secret-free: which part is down, nothing more. The database is asked each
 * time; storage and mail answers are shared for a few seconds (`checked` says when they
 * were taken), so a flood of health checks cannot cost the server much.
 */
export default defineEventHandler(async (event) => {
  const [database, storage, mail] = await Promise.all([databaseReachable(), probeStorage(), probeMail()])
  const parts = { database: database ? 'ok' : 'unreachable', storage: storage.ok ? 'ok' : 'unreachable', mail: mail.ok ? 'ok' : 'unreachable' } as const
  const down = Object.entries(parts).filter(([, state]) => state !== 'ok').map(([name]) => name)
  if (down.length) setResponseStatus(event, 503, `Unavailable: ${down.join(', ')}`)
  return { status: down.length ? 'unavailable' : 'ok', ...parts, down, checked: { storage: storage.checkedAt, mail: mail.checkedAt } }
})
