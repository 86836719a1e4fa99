import { ConfirmQuery } from '#shared/types/workspace'

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, SetupParams)
  const { confirm } = await getValidatedQuery(event, zodParser(ConfirmQuery))
  return { setup: await deleteSetup(useDb(), params.id, params.setupId, confirm === 'true') }
})
