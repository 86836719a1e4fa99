import { CommitPullsBody, type CommitPullsResponse } from '#shared/types/workspace'

export default defineEventHandler(async (event): Promise<CommitPullsResponse> => {
  const { user, params } = await requireWorkspace(event, BenchTestParams)
  const { files } = await readValidatedBody(event, batchParser(CommitPullsBody, 'files', input => listOf(input, 'files').map(f => nameOf(f, 'name'))))
  const ids = await importPulls(useDb(), params.id, files, { userId: user.id })
  setResponseStatus(event, 201)
  return { pulls: await pullSummaries(useDb(), params.id, ids) }
})
