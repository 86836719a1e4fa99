import { rolesAtLeast } from '#shared/types/roles'
import { BenchTestListQuery } from '#shared/types/workspace'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...rolesAtLeast('writer'))
  const query = await getValidatedQuery(event, zodParser(BenchTestListQuery))
  return { benchTests: await listBenchTests(useDb(), user, query) }
})
