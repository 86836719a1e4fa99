import { UpdatePullBody } from '#shared/types/pulls'
import { updatePull } from '~~/server/services/workspace/pulls'
import { PullParams, requireWorkspace } from '~~/server/services/workspace/route'

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, PullParams)
  const body = await readValidatedBody(event, zodParser(UpdatePullBody))
  return { pull: await updatePull(useDb(), params.id, params.pullId, body) }
})
