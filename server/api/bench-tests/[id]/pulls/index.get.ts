import type { CorrectionStandard } from '#shared/dyno'

export default defineEventHandler(async (event) => {
  const { params, benchTest } = await requireWorkspace(event, BenchTestParams)
  return listPulls(useDb(), params.id, benchTest.default_standard as CorrectionStandard)
})
