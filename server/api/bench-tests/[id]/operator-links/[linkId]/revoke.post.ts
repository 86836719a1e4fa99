import { IdSchema } from '#shared/types/workspace'

const Params = BenchTestParams.extend({ linkId: IdSchema })

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, Params)
  return { link: await revokeOperatorLink(useDb(), params.id, params.linkId) }
})
