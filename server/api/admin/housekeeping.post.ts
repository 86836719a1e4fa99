import { purgeExpiredRows } from '~~/server/services/accounts/housekeeping'

// The periodic purge of rows no rule reads any more (server/plugins/housekeeping.ts), on demand.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'admin')
  return purgeExpiredRows(useDb())
})
