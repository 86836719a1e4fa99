import { IdSchema } from '#shared/types/workspace'
import { requireWorkspace, SetupParams } from '~~/server/services/workspace/route'
import { deleteIdleCheck } from '~~/server/services/workspace/setups'

const Params = SetupParams.extend({ checkId: IdSchema })

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, Params)
  await deleteIdleCheck(useDb(), params.id, params.setupId, params.checkId)
  return { deleted: true }
})
