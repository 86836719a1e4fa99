// The number check's findings, handed from the panel that runs the check to the story
// preview beside it, which draws each one next to its paragraph (StoryBodyTree). Only
// the editor and the desk provide them; on readers' pages nothing is injected.
import type { InjectionKey, Ref } from 'vue'
import type { PlacedFinding } from '#shared/utils/number-note'

const NUMBER_NOTES: InjectionKey<Ref<PlacedFinding[]>> = Symbol('number-notes')

export function provideNumberNotes(): Ref<PlacedFinding[]> {
  const notes = ref<PlacedFinding[]>([])
  provide(NUMBER_NOTES, notes)
  return notes
}

export function injectNumberNotes(): Ref<PlacedFinding[]> | null {
  return inject(NUMBER_NOTES, null)
}
