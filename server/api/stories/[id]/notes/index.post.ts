import { CreateNoteBody, type StoryNote } from '#shared/types/stories'
import { addNote } from '~~/server/services/stories/notes'
import { requireStoryRoute } from '~~/server/services/stories/route'

export default defineEventHandler(async (event): Promise<{ note: StoryNote }> => {
  const { user, params } = await requireStoryRoute(event)
  const body = await readValidatedBody(event, zodParser(CreateNoteBody))
  const note = await addNote(useDb(), user, params.id, body)
  setResponseStatus(event, 201)
  return { note }
})
