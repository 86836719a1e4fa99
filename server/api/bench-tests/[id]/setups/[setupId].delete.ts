import { ConfirmQuery } from '#shared/types/bench-tests'
import { requireWorkspace, SetupParams } from '~~/server/services/workspace/route'
import { deleteSetup } from '~~/server/services/workspace/setups'

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, SetupParams)
  const { confirm } = await getValidatedQuery(event, zodParser(ConfirmQuery))
  return { setup: await deleteSetup(useDb(), params.id, params.setupId, confirm === 'true') }
})
