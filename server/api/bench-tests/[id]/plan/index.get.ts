import type { TestPlan } from '#shared/types/dyno-day'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'
import { getTestPlan } from '~~/server/services/workspace/test-plans'

export default defineEventHandler(async (event): Promise<{ plan: TestPlan }> => {
  const { params } = await requireWorkspace(event, BenchTestParams)
  return { plan: await getTestPlan(useDb(), params.id) }
})
