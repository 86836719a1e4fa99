import { UpdateNoteBody, type StoryNote } from '#shared/types/stories'
import { updateNote } from '~~/server/services/stories/notes'
import { requireStoryRoute, StoryNoteParams } from '~~/server/services/stories/route'

export default defineEventHandler(async (event): Promise<{ note: StoryNote }> => {
  const { user, params } = await requireStoryRoute(event, StoryNoteParams)
  const body = await readValidatedBody(event, zodParser(UpdateNoteBody))
  return { note: await updateNote(useDb(), user, params.id, params.noteId, body) }
})
