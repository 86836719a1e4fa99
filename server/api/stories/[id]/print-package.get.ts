// The story's print package: every figure at every column width, the photos' originals, captions and credits, as one ZIP.
import { sendPrintPackage } from '~~/server/services/figures/print-package'
import { deskFigureStory } from '~~/server/services/figures/story-source'
import { requireStoryRoute } from '~~/server/services/stories/route'

export default defineEventHandler(async (event) => {
  const { user, params } = await requireStoryRoute(event)
  return sendPrintPackage(useDb(), event, await deskFigureStory(useDb(), user, params.id))
})
