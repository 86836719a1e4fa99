import { ConfirmQuery } from '#shared/types/bench-tests'
import { deleteBenchTest } from '~~/server/services/workspace/bench-tests'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'

export default defineEventHandler(async (event) => {
  const { user, params } = await requireWorkspace(event, BenchTestParams)
  const { confirm } = await getValidatedQuery(event, zodParser(ConfirmQuery))
  return { benchTest: await deleteBenchTest(useDb(), user, params.id, confirm === 'true') }
})
