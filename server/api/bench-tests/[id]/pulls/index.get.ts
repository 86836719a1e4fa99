import type { CorrectionStandard } from '#shared/dyno'
import { listPulls } from '~~/server/services/workspace/pulls'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'

export default defineEventHandler(async (event) => {
  const { params, benchTest } = await requireWorkspace(event, BenchTestParams)
  return listPulls(useDb(), params.id, benchTest.default_standard as CorrectionStandard)
})
