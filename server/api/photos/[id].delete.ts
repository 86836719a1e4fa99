import { z } from 'zod'
import { rolesAtLeast } from '#shared/accounts/roles'
import { deletePhoto } from '~~/server/services/photos/photos'

const Params = z.object({ id: z.coerce.number().int().positive() })

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...rolesAtLeast('writer'))
  const { id } = await getValidatedRouterParams(event, zodParser(Params))
  await deletePhoto(useDb(), user, id)
  return { deleted: true }
})
