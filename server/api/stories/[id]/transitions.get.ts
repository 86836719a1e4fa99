import type { TransitionListResponse } from '#shared/types/stories'
import { listTransitions } from '~~/server/services/desk/transitions'
import { requireStoryRoute } from '~~/server/services/stories/route'

export default defineEventHandler(async (event): Promise<TransitionListResponse> => {
  const { user, params } = await requireStoryRoute(event)
  return { transitions: await listTransitions(useDb(), user, params.id) }
})
