// Words as readers type them and as stories are indexed (pure). One tokenizer for
// both sides, so whatever a story shows can be found: part types, engine families,
// tags, "V8", "5.7", "350" and the short common words a FULLTEXT index leaves out.

/** Longer tokens are cut; a query token cut the same way still matches as a prefix. */
export const MAX_TOKEN_LENGTH = 48
export const MAX_QUERY_TOKENS = 12

/** How much a word counts by where it stands in the story (best match first). */
export const SEARCH_WEIGHTS = { headline: 8, catalog: 4, deck: 2, body: 1 } as const

// A word is letters and digits; a decimal number keeps its point ("5.7", "0.050").
const WORD_SOURCE = String.raw`[\p{L}\p{N}]+(?:\.\p{N}+)*`
const WORD = new RegExp(WORD_SOURCE, 'gu')
// Words joined by hyphens with nothing between ("small-block", "5.7-liter").
const COMPOUND = new RegExp(`${WORD_SOURCE}(?:-${WORD_SOURCE})+`, 'gu')

function normalise(text: string): string {
  return text.normalize('NFKD').replace(/\p{M}+/gu, '').toLowerCase()
    // Thousands separators go: "5,500" and "5500" are the same number to a reader.
    .replace(/(?<=\p{N}),(?=\p{N}{3}(?!\p{N}))/gu, '')
}

// A lone letter says nothing; a lone digit can ("6 vs 8 ...") and costs little.
const keep = (t: string) => t.length > 1 || /\p{N}/u.test(t)

/** The words of a text, lower case without accents, in order, repeats kept. */
export function searchTokens(text: string): string[] {
  return (normalise(text).match(WORD) ?? []).filter(keep).map(t => t.slice(0, MAX_TOKEN_LENGTH))
}

/** The words of a text to index: its words and its hyphenated compounds written as one. */
export function indexTokens(text: string): string[] {
  const joined = (normalise(text).match(COMPOUND) ?? []).map(c => c.replace(/-/g, '').slice(0, MAX_TOKEN_LENGTH))
  return [...searchTokens(text), ...joined]
}

/**
 * The reader's words to look for, each one required and matched as the start of a
 * story word ("carb" finds "carburetor"). Repeats, and words that start another word
 * of the query, add nothing. Anything that is not a letter, digit or decimal point
 * is a separator, so nothing typed can change the query.
 */
export function queryTokens(q: string): string[] {
  const unique = [...new Set(searchTokens(q))]
  return unique.filter(t => !unique.some(o => o !== t && o.startsWith(t))).slice(0, MAX_QUERY_TOKENS)
}

export interface SearchSource {
  headline: string
  deck: string
  body: string
  /** part type and engine family (id and label of each) and the tags */
  catalog: readonly string[]
}

/** Each distinct token of a story with the weight of the best place it stands in. */
export function storySearchTerms(source: SearchSource): Map<string, number> {
  const out = new Map<string, number>()
  const add = (text: string, weight: number) => {
    for (const t of indexTokens(text)) out.set(t, Math.max(out.get(t) ?? 0, weight))
  }
  add(source.headline, SEARCH_WEIGHTS.headline)
  for (const c of source.catalog) add(c, SEARCH_WEIGHTS.catalog)
  add(source.deck, SEARCH_WEIGHTS.deck)
  add(source.body, SEARCH_WEIGHTS.body)
  return out
}
