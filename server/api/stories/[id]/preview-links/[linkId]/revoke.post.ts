import type { PreviewLink } from '#shared/types/stories'

export default defineEventHandler(async (event): Promise<{ link: PreviewLink }> => {
  const { user, params } = await requireStoryRoute(event, StoryLinkParams)
  return { link: await revokePreviewLink(user, params.id, params.linkId) }
})
