import { defineStore } from 'pinia'

/** How the story editor is laid out for this person (UI only; the story lives on the server). */
export const useEditorStore = defineStore('editor', () => {
  const showPreview = ref(true)
  const panel = ref<'notes' | 'revisions' | 'links'>('notes')
  return { showPreview, panel }
})
