import { SavePlanBody, type TestPlan } from '#shared/types/dyno-day'

export default defineEventHandler(async (event): Promise<{ plan: TestPlan }> => {
  const { user, params } = await requireWorkspace(event, BenchTestParams)
  const body = await readValidatedBody(event, zodParser(SavePlanBody))
  return { plan: await saveTestPlan(useDb(), user.id, params.id, body) }
})
