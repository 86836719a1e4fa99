import { UpdateSetupBody } from '#shared/types/setups'
import { requireWorkspace, SetupParams } from '~~/server/services/workspace/route'
import { updateSetup } from '~~/server/services/workspace/setups'

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, SetupParams)
  const body = await readValidatedBody(event, zodParser(UpdateSetupBody))
  return { setup: await updateSetup(useDb(), params.id, params.setupId, body) }
})
