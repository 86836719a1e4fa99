import { latestStories, MagazineListQuery } from '~~/server/services/magazine/lists'

export default defineEventHandler(async (event) => {
  const { page } = await getValidatedQuery(event, zodParser(MagazineListQuery))
  return latestStories(useDb(), page)
})
