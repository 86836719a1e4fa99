import { z } from 'zod'
import { UpdatePhotoBody } from '#shared/types/photos'
import { rolesAtLeast } from '#shared/accounts/roles'
import { updatePhotoMeta } from '~~/server/services/photos/photos'

const Params = z.object({ id: z.coerce.number().int().positive() })

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...rolesAtLeast('writer'))
  const { id } = await getValidatedRouterParams(event, zodParser(Params))
  const body = await readValidatedBody(event, zodParser(UpdatePhotoBody))
  return { photo: await updatePhotoMeta(useDb(), user, id, body) }
})
