import { InboxListQuery } from '#shared/types/inbox'
import { listInbox } from '~~/server/services/workspace/inbox'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'

export default defineEventHandler(async (event) => {
  const { params } = await requireWorkspace(event, BenchTestParams)
  const { state } = await getValidatedQuery(event, zodParser(InboxListQuery))
  return { files: await listInbox(useDb(), params.id, state) }
})
