import { CreatePreviewLinkBody, type CreatedPreviewLink } from '#shared/types/stories'
import { createPreviewLink } from '~~/server/services/stories/preview'
import { requireStoryRoute } from '~~/server/services/stories/route'

export default defineEventHandler(async (event): Promise<CreatedPreviewLink> => {
  const { user, params } = await requireStoryRoute(event)
  const body = await readValidatedBody(event, zodParser(CreatePreviewLinkBody))
  const created = await createPreviewLink(useDb(), user, params.id, body)
  setResponseStatus(event, 201)
  return created
})
