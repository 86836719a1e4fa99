import type { TestPlan } from '#shared/types/dyno-day'

export default defineEventHandler(async (event): Promise<{ plan: TestPlan }> => {
  const { params } = await requireWorkspace(event, BenchTestParams)
  return { plan: await getTestPlan(useDb(), params.id) }
})
