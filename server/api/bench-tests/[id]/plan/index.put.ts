import { SavePlanBody, type TestPlan } from '#shared/types/dyno-day'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'
import { saveTestPlan } from '~~/server/services/workspace/test-plans'

export default defineEventHandler(async (event): Promise<{ plan: TestPlan }> => {
  const { user, params } = await requireWorkspace(event, BenchTestParams)
  const body = await readValidatedBody(event, zodParser(SavePlanBody))
  return { plan: await saveTestPlan(useDb(), user.id, params.id, body) }
})
