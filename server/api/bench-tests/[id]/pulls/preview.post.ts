import type { PreviewPullsResponse } from '#shared/types/pull-imports'
import { checkPreviewBody, receiveCheckBody } from '~~/server/services/workspace/pull-pool'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'

// Parses and checks; nothing is saved. The body goes to the check pool chunk by chunk
// as it arrives (receiveCheckBody; 60 MB at most, server/utils/body-limit.ts): parsing 60 MB of JSON and validating
// it (PreviewPullsBody, in the worker) would hold up the event loop as long as the check.
export default defineEventHandler(async (event): Promise<PreviewPullsResponse> => {
  await requireWorkspace(event, BenchTestParams)
  const body = await receiveCheckBody(event)
  return { files: await checkPreviewBody(body) }
})
