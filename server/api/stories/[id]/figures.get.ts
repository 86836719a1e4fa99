import { z } from 'zod'
import type { StoryFigures } from '#shared/types/stories'
import { getStoryFigures } from '~~/server/services/stories/figures'
import { requireStoryRoute } from '~~/server/services/stories/route'

// ?uses=: the setups the editor's draft names ("all", or ids like "12,13"), so the
// preview is built from the same data an approval would freeze; default the saved body's.
const FiguresQuery = z.object({
  uses: z.string().regex(/^(all|\d+(,\d+){0,47})?$/, 'Use "all" or setup ids separated by commas').optional(),
  sheet: z.enum(['0', '1']).optional(),
  day: z.enum(['0', '1']).optional(),
})

export default defineEventHandler(async (event): Promise<StoryFigures> => {
  const { user, params } = await requireStoryRoute(event)
  const query = await getValidatedQuery(event, zodParser(FiguresQuery))
  const uses = query.uses === undefined
    ? undefined
    : { all: query.uses === 'all', ids: query.uses && query.uses !== 'all' ? query.uses.split(',').map(Number) : [], buildSheet: query.sheet === '1', dayReport: query.day === '1' }
  return getStoryFigures(useDb(), user, params.id, uses)
})
