import type { StoryRevision } from '#shared/types/stories'

export default defineEventHandler(async (event): Promise<{ revision: StoryRevision }> => {
  const { user, params } = await requireStoryRoute(event, StoryRevisionParams)
  return { revision: await getRevision(user, params.id, params.revisionId) }
})
