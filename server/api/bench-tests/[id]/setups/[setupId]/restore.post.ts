import { requireWorkspace, SetupParams } from '~~/server/services/workspace/route'
import { restoreSetup } from '~~/server/services/workspace/setups'

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, SetupParams)
  return { setup: await restoreSetup(useDb(), params.id, params.setupId) }
})
