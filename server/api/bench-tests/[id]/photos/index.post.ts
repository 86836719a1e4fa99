import { z } from 'zod'
import { rolesAtLeast } from '#shared/accounts/roles'
import { storeUploadedPhoto } from '~~/server/services/photos/photos'
import { readPhotoUpload } from '~~/server/services/photos/upload'
import { requireBenchTest } from '~~/server/services/workspace/bench-test-access'

const Params = z.object({ id: z.coerce.number().int().positive() })

// One photo per request (multipart, part "file"); the uploader sends several side by side.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...rolesAtLeast('writer'))
  const { id } = await getValidatedRouterParams(event, zodParser(Params))
  const benchTest = await requireBenchTest(useDb(), user, id)
  const upload = await readPhotoUpload(event)
  const result = await storeUploadedPhoto(useDb(), user, benchTest.id, upload)
  setResponseStatus(event, result.duplicate ? 200 : 201)
  return result
})
