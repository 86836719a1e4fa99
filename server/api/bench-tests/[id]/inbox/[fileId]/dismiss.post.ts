import { IdSchema } from '#shared/types/workspace'

const Params = BenchTestParams.extend({ fileId: IdSchema })

export default defineEventHandler(async (event) => {
  const { user, params } = await requireWorkspace(event, Params)
  return { file: await dismissInboxFile(useDb(), user.id, params.id, params.fileId) }
})
