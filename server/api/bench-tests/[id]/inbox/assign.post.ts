import type { CorrectionStandard } from '#shared/dyno'
import { AssignInboxBody } from '#shared/types/inbox'
import type { CommitPullsResponse } from '#shared/types/pull-imports'
import { assignInboxFiles, inboxFileNames } from '~~/server/services/workspace/inbox'
import { pullSummaries } from '~~/server/services/workspace/pulls'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'

export default defineEventHandler(async (event): Promise<CommitPullsResponse> => {
  const { user, params, benchTest } = await requireWorkspace(event, BenchTestParams)
  const body = await readValidatedBody(event, batchParser(AssignInboxBody, 'items', input => inboxFileNames(useDb(), params.id, listOf(input, 'items').map(i => (i as { fileId?: unknown } | null)?.fileId))))
  const ids = await assignInboxFiles(useDb(), user.id, params.id, benchTest.default_standard as CorrectionStandard, body)
  setResponseStatus(event, 201)
  return { pulls: await pullSummaries(useDb(), params.id, ids) }
})
