import { CopyPlanBody, type TestPlan } from '#shared/types/dyno-day'
import { requireBenchTest } from '~~/server/services/workspace/bench-test-access'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'
import { copyTestPlan } from '~~/server/services/workspace/test-plans'

export default defineEventHandler(async (event): Promise<{ plan: TestPlan }> => {
  const { user, params } = await requireWorkspace(event, BenchTestParams)
  const body = await readValidatedBody(event, zodParser(CopyPlanBody))
  // Only a bench test this user may open can be copied from (404 otherwise, as everywhere).
  await requireBenchTest(useDb(), user, body.fromBenchTestId)
  return { plan: await copyTestPlan(useDb(), user.id, params.id, body.fromBenchTestId, body.version) }
})
