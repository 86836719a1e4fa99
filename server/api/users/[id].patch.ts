import { z } from 'zod'
import { UpdateUserBody } from '#shared/types/users'
import { updateUser } from '~~/server/services/accounts/users'

const Params = z.object({ id: z.coerce.number().int().positive() })

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'admin')
  const { id } = await getValidatedRouterParams(event, zodParser(Params))
  const body = await readValidatedBody(event, zodParser(UpdateUserBody))
  return { user: await updateUser(useDb(), admin, id, body) }
})
