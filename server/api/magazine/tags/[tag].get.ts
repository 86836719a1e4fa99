export default defineEventHandler(async (event) => {
  const { tag } = await getValidatedRouterParams(event, zodParser(MagazineTagParams))
  const { page } = await getValidatedQuery(event, zodParser(MagazineListQuery))
  return { tag, ...await storiesByTag(tag, page) }
})
