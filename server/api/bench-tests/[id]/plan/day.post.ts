import { DayActionBody, type TestPlan } from '#shared/types/dyno-day'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'
import { applyDayAction } from '~~/server/services/workspace/test-plans'

// The moves of the day: start a step (it becomes current; operator files go to its setup), skip one, tick a checklist item.
export default defineEventHandler(async (event): Promise<{ plan: TestPlan }> => {
  const { params } = await requireWorkspace(event, BenchTestParams)
  const body = await readValidatedBody(event, zodParser(DayActionBody))
  return { plan: await applyDayAction(useDb(), params.id, body) }
})
