import { CreateOperatorLinkBody, type CreatedOperatorLink } from '#shared/types/operator-links'
import { createOperatorLink } from '~~/server/services/workspace/operator-links'
import { BenchTestParams, requireWorkspace } from '~~/server/services/workspace/route'

export default defineEventHandler(async (event): Promise<CreatedOperatorLink> => {
  const { user, params } = await requireWorkspace(event, BenchTestParams)
  const body = await readValidatedBody(event, zodParser(CreateOperatorLinkBody))
  const created = await createOperatorLink(useDb(), user.id, params.id, body, appConfig().baseUrl)
  setResponseStatus(event, 201)
  setResponseHeader(event, 'cache-control', 'no-store')
  return created
})
