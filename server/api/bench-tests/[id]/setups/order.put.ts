import { SetupOrderBody } from '#shared/types/workspace'

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, BenchTestParams)
  const { setupIds } = await readValidatedBody(event, zodParser(SetupOrderBody))
  return { setups: await reorderSetups(useDb(), params.id, setupIds) }
})
