import { rolesAtLeast } from '#shared/accounts/roles'
import { CreateBenchTestBody } from '#shared/types/bench-tests'
import { createBenchTest } from '~~/server/services/workspace/bench-test-core'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...rolesAtLeast('writer'))
  const body = await readValidatedBody(event, zodParser(CreateBenchTestBody))
  const benchTest = await createBenchTest(useDb(), user.id, body)
  setResponseStatus(event, 201)
  return { benchTest }
})
