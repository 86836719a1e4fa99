// A credit is shown after "Photo:". People often type the word themselves ("Photo: J. Doe",
// "Photos by ..."), which would read "Photo: Photo: ...", so a leading label is dropped.
// Pure; the reader's page imports it (no zod).

const LEADING_LABEL = /^\s*(?:photos?|photograph(?:s|y)?|image|pictures?|pics?)\s*(?::|-|–|—|by\b)\s*/i

/** The credit without a label its author typed in front: "Photo: A. Smith" -> "A. Smith". */
export function bareCredit(credit: string): string {
  return credit.replace(LEADING_LABEL, '').trim()
}

/** "Photo: A. Smith", or '' without a credit (a lone "Photo:" says nothing). */
export function creditLine(credit: string | null | undefined): string {
  const bare = bareCredit(credit ?? '')
  return bare ? `Photo: ${bare}` : ''
}
