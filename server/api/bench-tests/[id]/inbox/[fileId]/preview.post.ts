import { IdSchema, InboxPreviewBody } from '#shared/types/workspace'

const Params = BenchTestParams.extend({ fileId: IdSchema })

// The stored file checked again (with a mapping); nothing is saved.
export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, Params)
  const { mapping } = await readValidatedBody(event, zodParser(InboxPreviewBody))
  return { preview: await previewInboxFile(useDb(), params.id, params.fileId, mapping) }
})
