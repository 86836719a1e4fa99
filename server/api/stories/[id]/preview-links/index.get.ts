import type { PreviewLink } from '#shared/types/stories'

export default defineEventHandler(async (event): Promise<{ links: PreviewLink[] }> => {
  const { user, params } = await requireStoryRoute(event)
  return { links: await listPreviewLinks(user, params.id) }
})
