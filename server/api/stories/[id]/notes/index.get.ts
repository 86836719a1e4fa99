import type { NoteListResponse } from '#shared/types/stories'
import { listNotes } from '~~/server/services/stories/notes'
import { requireStoryRoute } from '~~/server/services/stories/route'

export default defineEventHandler(async (event): Promise<NoteListResponse> => {
  const { user, params } = await requireStoryRoute(event)
  return listNotes(useDb(), user, params.id)
})
