import { DeskQueueQuery, type DeskQueueResponse } from '#shared/types/stories'
import { rolesAtLeast } from '#shared/accounts/roles'
import { deskQueue } from '~~/server/services/stories/lists'

export default defineEventHandler(async (event): Promise<DeskQueueResponse> => {
  const user = await requireRole(event, ...rolesAtLeast('editor'))
  const { state = 'in_review' } = await getValidatedQuery(event, zodParser(DeskQueueQuery))
  return { state, items: await deskQueue(useDb(), user, state) }
})
