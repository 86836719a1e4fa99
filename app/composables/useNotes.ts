import type { NoteListResponse, StoryNote } from '#shared/types/stories'

export const notesKey = (storyId: number) => `story-notes:${storyId}`

/** The threads of notes on a story; notes are plain text and are shown only as text. */
export function useNotes(storyId: MaybeRefOrGetter<number>) {
  const list = useFetch<NoteListResponse>(() => storyPath(toValue(storyId), '/notes'), {
    key: computed(() => notesKey(toValue(storyId))),
  })

  async function add(body: { body: string, parentId?: number, anchor?: string }) {
    const res = await $fetch<{ note: StoryNote }>(storyPath(toValue(storyId), '/notes'), { method: 'POST', body })
    await list.refresh()
    return res.note
  }

  async function setResolved(noteId: number, resolved: boolean) {
    await $fetch(storyPath(toValue(storyId), `/notes/${noteId}`), { method: 'PATCH', body: { resolved } })
    await list.refresh()
  }

  return { ...list, add, setResolved }
}
