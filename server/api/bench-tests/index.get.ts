import { rolesAtLeast } from '#shared/accounts/roles'
import { BenchTestListQuery } from '#shared/types/bench-tests'
import { listBenchTests } from '~~/server/services/workspace/bench-tests'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...rolesAtLeast('writer'))
  const query = await getValidatedQuery(event, zodParser(BenchTestListQuery))
  return { benchTests: await listBenchTests(useDb(), user, query) }
})
