import { MagazineSearchQuery, searchStories } from '~~/server/services/magazine/lists'

export default defineEventHandler(async (event) => {
  const { q, page } = await getValidatedQuery(event, zodParser(MagazineSearchQuery))
  return { q, ...await searchStories(useDb(), q, page) }
})
