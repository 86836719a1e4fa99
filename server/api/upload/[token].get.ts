import type { UploadLinkInfo } from '#shared/types/operator-links'
import { uploadLinkInfo } from '~~/server/services/workspace/operator-links'
import { uploadToken } from '~~/server/services/workspace/route'

// Public: the link itself is the credential, and it reveals only the title and limits.
export default defineEventHandler(async (event): Promise<UploadLinkInfo> => {
  setResponseHeader(event, 'cache-control', 'no-store')
  return uploadLinkInfo(useDb(), uploadToken(event))
})
