import type { CommitPullsResponse } from '#shared/types/pull-imports'
import type { CorrectionStandard } from '#shared/dyno'
import { insertCheckedPulls } from '~~/server/services/workspace/pull-import'
import { checkImportBody, receiveCheckBody } from '~~/server/services/workspace/pull-pool'
import { pullSummaries } from '~~/server/services/workspace/pulls'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'

// The body (60 MB at most, server/utils/body-limit.ts) goes to the check pool chunk
// by chunk as it arrives (receiveCheckBody): the worker parses the JSON, validates it (CommitPullsBody) and checks the
// files; this thread only saves the checked pulls in one transaction.
export default defineEventHandler(async (event): Promise<CommitPullsResponse> => {
  const { user, params, benchTest } = await requireWorkspace(event, BenchTestParams)
  const body = await receiveCheckBody(event)
  const checked = await checkImportBody(body, benchTest.default_standard as CorrectionStandard)
  const db = useDb()
  // The answer is read inside the transaction: once the pulls are committed, an outage
  // cannot turn their 201 into an error that invites the writer to import them twice.
  const pulls = await db.transaction(async (trx) => {
    const ids = await insertCheckedPulls(trx, params.id, checked, { userId: user.id })
    return pullSummaries(trx, params.id, ids)
  })
  setResponseStatus(event, 201)
  return { pulls }
})
