import { BuildSheetBody } from '#shared/types/build-sheets'
import { putBuildSheet } from '~~/server/services/workspace/build-sheets'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, BenchTestParams)
  const body = await readValidatedBody(event, zodParser(BuildSheetBody))
  return { buildSheet: await putBuildSheet(useDb(), params.id, body) }
})
