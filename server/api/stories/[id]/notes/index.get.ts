import type { NoteListResponse } from '#shared/types/stories'

export default defineEventHandler(async (event): Promise<NoteListResponse> => {
  const { user, params } = await requireStoryRoute(event)
  return listNotes(user, params.id)
})
