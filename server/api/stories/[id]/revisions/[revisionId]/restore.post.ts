import { RestoreRevisionBody, type StoryResponse } from '#shared/types/stories'
import { restoreRevision } from '~~/server/services/stories/revisions'
import { requireStoryRoute, StoryRevisionParams } from '~~/server/services/stories/route'

export default defineEventHandler(async (event): Promise<StoryResponse> => {
  const { user, params } = await requireStoryRoute(event, StoryRevisionParams)
  const body = await readValidatedBody(event, zodParser(RestoreRevisionBody))
  return { story: await restoreRevision(useDb(), user, params.id, params.revisionId, body.version) }
})
