import { getPullFile } from '~~/server/services/workspace/pulls'
import { PullParams, requireWorkspace, sendCsvFile } from '~~/server/services/workspace/route'
// The original file exactly as uploaded.
export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, PullParams)
  const file = await getPullFile(useDb(), params.id, params.pullId)
  return sendCsvFile(event, file.fileName, file.text)
})
