import { getPullDetail } from '~~/server/services/workspace/pulls'
import { PullParams, requireWorkspace } from '~~/server/services/workspace/route'

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, PullParams)
  return { pull: await getPullDetail(useDb(), params.id, params.pullId) }
})
