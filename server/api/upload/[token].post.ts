import type { UploadReceipt } from '#shared/types/operator-links'
import { openUploadLink, receiveUploads } from '~~/server/services/workspace/operator-links'
import { readOperatorUpload } from '~~/server/services/workspace/operator-upload'
import { uploadToken } from '~~/server/services/workspace/route'

// Public: files for the bench test's inbox, as multipart/form-data parts named "file".
// The link is checked before any of the body is read.
export default defineEventHandler(async (event): Promise<UploadReceipt> => {
  setResponseHeader(event, 'cache-control', 'no-store')
  const token = uploadToken(event)
  try {
    const link = await openUploadLink(useDb(), token)
    const files = await readOperatorUpload(event, link.maxFileBytes)
    const receipt = await receiveUploads(useDb(), token, files)
    setResponseStatus(event, 201)
    return receipt
  }
  catch (error) {
    // Whatever refused the upload, the rest of its body is not read.
    stopReadingBody(event)
    throw error
  }
})
