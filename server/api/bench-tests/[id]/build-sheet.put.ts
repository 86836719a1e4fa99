import { BuildSheetBody } from '#shared/types/workspace'

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, BenchTestParams)
  const body = await readValidatedBody(event, zodParser(BuildSheetBody))
  return { buildSheet: await putBuildSheet(useDb(), params.id, body) }
})
