// The number check's findings, handed from the panel that runs the check to the story
// preview beside it, which draws each one next to its paragraph (StoryBodyTree). Only
// the editor and the desk provide them; on readers' pages nothing is injected. The
// provider hands over the function that picks a paragraph's findings too, so the
// reader's story page (which provides nothing) never loads shared/utils/number-note.ts.
import type { InjectionKey, Ref } from 'vue'
import type { PlacedFinding } from '#shared/utils/number-note'

/** shared/utils/number-note.ts' findingsInBlock. */
export type FindingsInBlock = (blockText: string, placed: readonly PlacedFinding[], counts: Map<string, number>) => PlacedFinding[]

export interface NumberNotes { notes: Ref<PlacedFinding[]>, inBlock: FindingsInBlock }

const NUMBER_NOTES: InjectionKey<NumberNotes> = Symbol('number-notes')

export function provideNumberNotes(inBlock: FindingsInBlock): Ref<PlacedFinding[]> {
  const notes = ref<PlacedFinding[]>([])
  provide(NUMBER_NOTES, { notes, inBlock })
  return notes
}

export function injectNumberNotes(): NumberNotes | null {
  return inject(NUMBER_NOTES, null)
}
