// One tokenizer for the readers' words and the stories' words (server/services/magazine/search-terms.ts).
// The cases are the searches readers made that a FULLTEXT index could not answer
// (issue 15 item 12): short words, numbers with a point, stop words.
// Source for what FULLTEXT drops: MariaDB Knowledge Base, "Full-Text Index Overview"
// (innodb_ft_min_token_size 3, the InnoDB stop-word list) (published).
import { describe, expect, it } from 'vitest'
import { indexTokens, queryTokens, searchTokens, storySearchTerms, SEARCH_WEIGHTS } from '../../../server/services/magazine/search-terms'

describe('queryTokens', () => {
  it.each([
    ['camshaft', ['camshaft']],
    ['pushrod V8', ['pushrod', 'v8']],
    ['5.7', ['5.7']],
    ['6.3 L', ['6.3']],
    ['350', ['350']],
    ['and the', ['and', 'the']],
    ['  Dual-plane   intake ', ['dual', 'plane', 'intake']],
    // Operators typed by the reader are separators, never operators.
    ['"headers" -carb +(timing)~ @8 %_', ['headers', 'carb', 'timing', '8']],
    ['Zündung 6,200', ['zundung', '6200']],
    ['It made 350.', ['it', 'made', '350']],
    ['cam camshaft CAM', ['camshaft']],
    ['a b', []],
  ])('%j looks for %j', (q, tokens) => {
    expect(queryTokens(q)).toEqual(tokens)
  })

  it('keeps at most twelve words', () => {
    expect(queryTokens(Array.from({ length: 20 }, (_, i) => `word${i}x`).join(' '))).toHaveLength(12)
  })

  it('cuts very long words where the index cuts them', () => {
    expect(searchTokens('x'.repeat(80))).toEqual(['x'.repeat(48)])
  })
})

describe('indexTokens', () => {
  it('adds hyphenated compounds written as one word', () => {
    expect(indexTokens('A small-block 5.7-liter')).toEqual(['small', 'block', '5.7', 'liter', 'smallblock', '5.7liter'])
  })
})

describe('storySearchTerms', () => {
  it('weighs each word by the best place it stands', () => {
    const terms = storySearchTerms({
      headline: 'Long tubes on the 6.3',
      deck: 'Headers against manifolds',
      body: 'The tubes made power.',
      catalog: ['exhaust', 'Exhaust and headers', 'pushrod-v8', 'Pushrod V8', 'small-block'],
    })
    expect(terms.get('tubes')).toBe(SEARCH_WEIGHTS.headline)
    expect(terms.get('6.3')).toBe(SEARCH_WEIGHTS.headline)
    expect(terms.get('headers')).toBe(SEARCH_WEIGHTS.catalog)
    expect(terms.get('v8')).toBe(SEARCH_WEIGHTS.catalog)
    expect(terms.get('pushrodv8')).toBe(SEARCH_WEIGHTS.catalog)
    expect(terms.get('manifolds')).toBe(SEARCH_WEIGHTS.deck)
    expect(terms.get('power')).toBe(SEARCH_WEIGHTS.body)
  })
})
