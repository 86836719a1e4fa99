import { getBenchTestDetail } from '~~/server/services/workspace/bench-tests'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'

export default defineEventHandler(async (event) => {
  const { user, params } = await requireWorkspace(event, BenchTestParams)
  return getBenchTestDetail(useDb(), user, params.id)
})
