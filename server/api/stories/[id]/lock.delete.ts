import type { LockResponse } from '#shared/types/stories'

export default defineEventHandler(async (event): Promise<LockResponse> => {
  const { user, params } = await requireStoryRoute(event)
  return releaseStoryLock(user, params.id)
})
