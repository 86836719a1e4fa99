import type { PreviewLink } from '#shared/types/stories'
import { revokePreviewLink } from '~~/server/services/stories/preview'
import { requireStoryRoute, StoryLinkParams } from '~~/server/services/stories/route'

export default defineEventHandler(async (event): Promise<{ link: PreviewLink }> => {
  const { user, params } = await requireStoryRoute(event, StoryLinkParams)
  return { link: await revokePreviewLink(useDb(), user, params.id, params.linkId) }
})
