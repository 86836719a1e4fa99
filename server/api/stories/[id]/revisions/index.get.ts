import type { RevisionListResponse } from '#shared/types/stories'
import { listRevisions } from '~~/server/services/stories/revisions'
import { requireStoryRoute } from '~~/server/services/stories/route'

export default defineEventHandler(async (event): Promise<RevisionListResponse> => {
  const { user, params } = await requireStoryRoute(event)
  return { revisions: await listRevisions(useDb(), user, params.id) }
})
