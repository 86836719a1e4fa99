import type { PreviewLink } from '#shared/types/stories'
import { listPreviewLinks } from '~~/server/services/stories/preview'
import { requireStoryRoute } from '~~/server/services/stories/route'

export default defineEventHandler(async (event): Promise<{ links: PreviewLink[] }> => {
  const { user, params } = await requireStoryRoute(event)
  return { links: await listPreviewLinks(useDb(), user, params.id) }
})
