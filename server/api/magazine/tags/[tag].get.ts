import { MagazineListQuery, MagazineTagParams, storiesByTag } from '~~/server/services/magazine/lists'

export default defineEventHandler(async (event) => {
  const { tag } = await getValidatedRouterParams(event, zodParser(MagazineTagParams))
  const { page } = await getValidatedQuery(event, zodParser(MagazineListQuery))
  return { tag, ...await storiesByTag(useDb(), tag, page) }
})
