import type { TransitionListResponse } from '#shared/types/stories'

export default defineEventHandler(async (event): Promise<TransitionListResponse> => {
  const { user, params } = await requireStoryRoute(event)
  return { transitions: await listTransitions(user, params.id) }
})
