import type { StoryRevision } from '#shared/types/stories'
import { getRevision } from '~~/server/services/stories/revisions'
import { requireStoryRoute, StoryRevisionParams } from '~~/server/services/stories/route'

export default defineEventHandler(async (event): Promise<{ revision: StoryRevision }> => {
  const { user, params } = await requireStoryRoute(event, StoryRevisionParams)
  return { revision: await getRevision(useDb(), user, params.id, params.revisionId) }
})
