import type { NumberCheckResult } from '#shared/types/stories'
import { runNumberCheck } from '~~/server/services/stories/figures'
import { requireStoryRoute } from '~~/server/services/stories/route'

// Not a pure read: an editor opening it records the check as seen for this version (the approve guard).
export default defineEventHandler(async (event): Promise<NumberCheckResult> => {
  const { user, params } = await requireStoryRoute(event)
  setResponseHeader(event, 'Cache-Control', 'no-store')
  return runNumberCheck(useDb(), user, params.id)
})
