import { IdSchema } from '#shared/types/workspace'
import { revokeOperatorLink } from '~~/server/services/workspace/operator-links'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'

const Params = BenchTestParams.extend({ linkId: IdSchema })

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, Params)
  return { link: await revokeOperatorLink(useDb(), params.id, params.linkId) }
})
