import { z } from 'zod'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'
import { listSetups } from '~~/server/services/workspace/setups'

const Query = z.object({ deleted: z.enum(['only']).optional() })

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, BenchTestParams)
  const { deleted } = await getValidatedQuery(event, zodParser(Query))
  return { setups: await listSetups(useDb(), params.id, { deleted: deleted === 'only' }) }
})
