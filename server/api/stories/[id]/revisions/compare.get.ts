import { RevisionCompareQuery, type RevisionComparison } from '#shared/types/stories'
import { compareRevisions } from '~~/server/services/stories/revisions'
import { requireStoryRoute } from '~~/server/services/stories/route'

export default defineEventHandler(async (event): Promise<RevisionComparison> => {
  const { user, params } = await requireStoryRoute(event)
  const query = await getValidatedQuery(event, zodParser(RevisionCompareQuery))
  return compareRevisions(useDb(), user, params.id, query.from, query.to)
})
