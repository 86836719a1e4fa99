import { IdleCheckBody } from '#shared/types/setups'
import { requireWorkspace, SetupParams } from '~~/server/services/workspace/route'
import { addIdleCheck } from '~~/server/services/workspace/setups'

export default defineEventHandler(async (event) => {
  const { user, params } = await requireWorkspace(event, SetupParams)
  const body = await readValidatedBody(event, zodParser(IdleCheckBody))
  const idleCheck = await addIdleCheck(useDb(), params.id, params.setupId, body, user.id)
  setResponseStatus(event, 201)
  return { idleCheck }
})
