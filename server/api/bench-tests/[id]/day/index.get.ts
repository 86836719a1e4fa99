import type { CorrectionStandard } from '#shared/dyno'
import type { DayView } from '#shared/types/dyno-day'

export default defineEventHandler(async (event): Promise<DayView> => {
  const { params, benchTest } = await requireWorkspace(event, BenchTestParams)
  setResponseHeader(event, 'cache-control', 'no-store')
  return getDayView(useDb(), params.id, benchTest.default_standard as CorrectionStandard)
})
