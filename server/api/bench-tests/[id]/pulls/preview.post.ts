import { PreviewPullsBody, type PreviewPullsResponse } from '#shared/types/workspace'

// Parses and checks; nothing is saved.
export default defineEventHandler(async (event): Promise<PreviewPullsResponse> => {
  await requireWorkspace(event, BenchTestParams)
  assertBodySize(event, MAX_IMPORT_BODY_BYTES)
  const { files } = await readValidatedBody(event, zodParser(PreviewPullsBody))
  return { files: files.map(f => checkPullFile(f).preview) }
})
