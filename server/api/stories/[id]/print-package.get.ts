// The story's print package: every figure at every column width, the photos' originals, captions and credits, as one ZIP.
import { sendPrintPackage } from '~~/server/utils/figure-export/print-package'
import { deskFigureStory } from '~~/server/utils/figure-export/story-source'

export default defineEventHandler(async (event) => {
  const { user, params } = await requireStoryRoute(event)
  return sendPrintPackage(event, await deskFigureStory(user, params.id))
})
