import { TransitionBody, type TransitionResponse } from '#shared/types/stories'
import { runTransition } from '~~/server/services/desk/transitions'
import { requireStoryRoute } from '~~/server/services/stories/route'

export default defineEventHandler(async (event): Promise<TransitionResponse> => {
  const { user, params } = await requireStoryRoute(event)
  const body = await readValidatedBody(event, zodParser(TransitionBody))
  return runTransition(useDb(), user, params.id, body)
})
