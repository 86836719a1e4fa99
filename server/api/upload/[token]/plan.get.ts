import type { OperatorPlanView } from '#shared/types/dyno-day'
import { operatorPlanView } from '~~/server/services/workspace/dyno-day'
import { linkBenchTestId } from '~~/server/services/workspace/operator-links'
import { uploadToken } from '~~/server/services/workspace/route'

// Public: the link's holder may see the plan's steps and what was received, nothing else.
export default defineEventHandler(async (event): Promise<{ plan: OperatorPlanView | null }> => {
  setResponseHeader(event, 'cache-control', 'no-store')
  const db = useDb()
  return { plan: await operatorPlanView(db, await linkBenchTestId(db, uploadToken(event))) }
})
