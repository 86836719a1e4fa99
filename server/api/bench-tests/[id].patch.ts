import { UpdateBenchTestBody } from '#shared/types/bench-tests'
import { updateBenchTest } from '~~/server/services/workspace/bench-tests'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'

export default defineEventHandler(async (event) => {
  const { user, params } = await requireWorkspace(event, BenchTestParams)
  const body = await readValidatedBody(event, zodParser(UpdateBenchTestBody))
  return { benchTest: await updateBenchTest(useDb(), user, params.id, body) }
})
