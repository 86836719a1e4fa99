// One figure of a story for the print edition: SVG or PDF at one, two or three columns; the results table as PDF or CSV.
import { PrintExportQuery, PrintFigureParams, storyPrintFile } from '~~/server/services/figures/print-exports'
import { deskFigureStory } from '~~/server/services/figures/story-source'
import { sendDownload } from '~~/server/services/figures/download'
import { requireStoryRoute } from '~~/server/services/stories/route'

export default defineEventHandler(async (event) => {
  const { user, params } = await requireStoryRoute(event, PrintFigureParams)
  const query = await getValidatedQuery(event, zodParser(PrintExportQuery))
  const file = await storyPrintFile(useDb(), await deskFigureStory(useDb(), user, params.id), params.number, query.format, query.columns)
  return sendDownload(event, file)
})
