export default defineEventHandler(async (event) => {
  const { family } = await getValidatedRouterParams(event, zodParser(MagazineFamilyParams))
  const { page } = await getValidatedQuery(event, zodParser(MagazineListQuery))
  return storiesByEngineFamily(family, page)
})
