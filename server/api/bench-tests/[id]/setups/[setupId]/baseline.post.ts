import { requireWorkspace, SetupParams } from '~~/server/services/workspace/route'
import { makeBaseline } from '~~/server/services/workspace/setups'

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, SetupParams)
  return { setups: await makeBaseline(useDb(), params.id, params.setupId) }
})
