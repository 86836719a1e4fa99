import { LockBody, type LockResponse } from '#shared/types/stories'
import { takeStoryLock } from '~~/server/services/stories/locks'
import { requireStoryRoute } from '~~/server/services/stories/route'

export default defineEventHandler(async (event): Promise<LockResponse> => {
  const { user, params } = await requireStoryRoute(event)
  const body = await readValidatedBody(event, zodParser(LockBody))
  return takeStoryLock(useDb(), user, params.id, body.takeOver)
})
