import type { LockResponse } from '#shared/types/stories'
import { releaseStoryLock } from '~~/server/services/stories/locks'
import { requireStoryRoute } from '~~/server/services/stories/route'

export default defineEventHandler(async (event): Promise<LockResponse> => {
  const { user, params } = await requireStoryRoute(event)
  return releaseStoryLock(useDb(), user, params.id)
})
