import type { CorrectionStandard } from '#shared/dyno'
import type { DayView } from '#shared/types/dyno-day'
import { getDayView } from '~~/server/services/workspace/dyno-day'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'

export default defineEventHandler(async (event): Promise<DayView> => {
  const { params, benchTest } = await requireWorkspace(event, BenchTestParams)
  setResponseHeader(event, 'cache-control', 'no-store')
  return getDayView(useDb(), params.id, benchTest.default_standard as CorrectionStandard)
})
