import { MagazineFamilyParams, MagazineListQuery, storiesByEngineFamily } from '~~/server/services/magazine/lists'

export default defineEventHandler(async (event) => {
  const { family } = await getValidatedRouterParams(event, zodParser(MagazineFamilyParams))
  const { page } = await getValidatedQuery(event, zodParser(MagazineListQuery))
  return storiesByEngineFamily(useDb(), family, page)
})
