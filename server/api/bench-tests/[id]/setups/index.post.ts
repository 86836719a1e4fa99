import { CreateSetupBody } from '#shared/types/workspace'

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, BenchTestParams)
  const body = await readValidatedBody(event, zodParser(CreateSetupBody))
  const setup = await createSetup(useDb(), params.id, body)
  setResponseStatus(event, 201)
  return { setup }
})
