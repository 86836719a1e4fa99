import { InboxPreviewBody } from '#shared/types/inbox'
import { IdSchema } from '#shared/types/workspace'
import { previewInboxFile } from '~~/server/services/workspace/inbox'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'

const Params = BenchTestParams.extend({ fileId: IdSchema })

// The stored file checked again (with a mapping); nothing is saved.
export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, Params)
  const { mapping } = await readValidatedBody(event, zodParser(InboxPreviewBody))
  return { preview: await previewInboxFile(useDb(), params.id, params.fileId, mapping) }
})
