import type { PreviewPullsResponse } from '#shared/types/workspace'

// Parses and checks; nothing is saved. The body goes to the check pool as received:
// parsing 60 MB of JSON and validating it (PreviewPullsBody, in the worker) would hold
// up the event loop as long as the check itself.
export default defineEventHandler(async (event): Promise<PreviewPullsResponse> => {
  await requireWorkspace(event, BenchTestParams)
  const body = await readLimitedBody(event, MAX_IMPORT_BODY_BYTES)
  return { files: await checkPreviewBody(body) }
})
