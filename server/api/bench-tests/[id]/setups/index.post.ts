import { CreateSetupBody } from '#shared/types/setups'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'
import { createSetup } from '~~/server/services/workspace/setups'

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, BenchTestParams)
  const body = await readValidatedBody(event, zodParser(CreateSetupBody))
  const setup = await createSetup(useDb(), params.id, body)
  setResponseStatus(event, 201)
  return { setup }
})
