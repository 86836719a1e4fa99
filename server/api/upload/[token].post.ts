import { OPERATOR_LINK_LIMITS, PULL_LIMITS, type UploadReceipt } from '#shared/types/workspace'

// Public: files for the bench test's inbox, as multipart/form-data parts named "file".
export default defineEventHandler(async (event): Promise<UploadReceipt> => {
  setResponseHeader(event, 'cache-control', 'no-store')
  const token = uploadToken(event)
  assertBodySize(event, PULL_LIMITS.maxFilesPerBatch * OPERATOR_LINK_LIMITS.maxFileBytes + 1024 * 1024)
  if (!(getRequestHeader(event, 'content-type') ?? '').startsWith('multipart/form-data')) {
    throw createError({ statusCode: 400, statusMessage: 'Bad Request', message: 'Send the files as multipart/form-data, each part named "file".' })
  }
  const parts = (await readMultipartFormData(event)) ?? []
  const files = parts.filter(p => p.name === 'file' && p.filename !== undefined)
    .map((p, i) => ({ name: cleanFileName(p.filename, `upload-${i + 1}.csv`), data: p.data }))
  try {
    const receipt = await receiveUploads(useDb(), token, files)
    setResponseStatus(event, 201)
    return receipt
  }
  catch (error) {
    const retry = (error as { data?: { retryAfterSeconds?: number } }).data?.retryAfterSeconds
    if (retry) setResponseHeader(event, 'Retry-After', retry)
    throw error
  }
})
