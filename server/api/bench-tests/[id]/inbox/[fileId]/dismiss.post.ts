import { IdSchema } from '#shared/types/workspace'
import { dismissInboxFile } from '~~/server/services/workspace/inbox'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'

const Params = BenchTestParams.extend({ fileId: IdSchema })

export default defineEventHandler(async (event) => {
  const { user, params } = await requireWorkspace(event, Params)
  return { file: await dismissInboxFile(useDb(), user.id, params.id, params.fileId) }
})
