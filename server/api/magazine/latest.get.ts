export default defineEventHandler(async (event) => {
  const { page } = await getValidatedQuery(event, zodParser(MagazineListQuery))
  return latestStories(page)
})
