import { MagazineListQuery, MagazinePartParams, storiesByPartType } from '~~/server/services/magazine/lists'

export default defineEventHandler(async (event) => {
  const { type } = await getValidatedRouterParams(event, zodParser(MagazinePartParams))
  const { page } = await getValidatedQuery(event, zodParser(MagazineListQuery))
  return storiesByPartType(useDb(), type, page)
})
