import { UpdateBenchTestBody } from '#shared/types/workspace'

export default defineEventHandler(async (event) => {
  const { user, params } = await requireWorkspace(event, BenchTestParams)
  const body = await readValidatedBody(event, zodParser(UpdateBenchTestBody))
  return { benchTest: await updateBenchTest(useDb(), user, params.id, body) }
})
