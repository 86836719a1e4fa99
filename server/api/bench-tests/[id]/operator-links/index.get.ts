import { listOperatorLinks } from '~~/server/services/workspace/operator-links'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, BenchTestParams)
  return { links: await listOperatorLinks(useDb(), params.id) }
})
