import { CreateOperatorLinkBody, type CreatedOperatorLink } from '#shared/types/workspace'

export default defineEventHandler(async (event): Promise<CreatedOperatorLink> => {
  const { user, params } = await requireWorkspace(event, BenchTestParams)
  const body = await readValidatedBody(event, zodParser(CreateOperatorLinkBody))
  const created = await createOperatorLink(useDb(), user.id, params.id, body, appConfig().baseUrl)
  setResponseStatus(event, 201)
  setResponseHeader(event, 'cache-control', 'no-store')
  return created
})
