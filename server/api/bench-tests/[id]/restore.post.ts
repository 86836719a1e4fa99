import { rolesAtLeast } from '#shared/accounts/roles'
import { restoreBenchTest } from '~~/server/services/workspace/bench-tests'
import { BenchTestParams } from '~~/server/services/workspace/route'

// Not requireWorkspace: the bench test is deleted, so it is looked up among the deleted ones.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...rolesAtLeast('writer'))
  const { id } = await getValidatedRouterParams(event, zodParser(BenchTestParams))
  return { benchTest: await restoreBenchTest(useDb(), user, id) }
})
