import { ConfirmQuery } from '#shared/types/workspace'

export default defineEventHandler(async (event) => {
  const { user, params } = await requireWorkspace(event, BenchTestParams)
  const { confirm } = await getValidatedQuery(event, zodParser(ConfirmQuery))
  return { benchTest: await deleteBenchTest(useDb(), user, params.id, confirm === 'true') }
})
