import { SetupOrderBody } from '#shared/types/setups'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'
import { reorderSetups } from '~~/server/services/workspace/setups'

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, BenchTestParams)
  const { setupIds } = await readValidatedBody(event, zodParser(SetupOrderBody))
  return { setups: await reorderSetups(useDb(), params.id, setupIds) }
})
