import type { RevisionListResponse } from '#shared/types/stories'

export default defineEventHandler(async (event): Promise<RevisionListResponse> => {
  const { user, params } = await requireStoryRoute(event)
  return { revisions: await listRevisions(user, params.id) }
})
