// The reader's words become a FULLTEXT boolean query in which every word is
// required and may be a prefix; nothing typed can act as an operator.
import { describe, expect, it } from 'vitest'
import { fullTextTerms } from '../../../server/utils/magazine-search-terms'

describe('fullTextTerms', () => {
  it.each([
    ['cam swap', '+cam* +swap*'],
    ['  Dual-plane   intake ', '+Dual* +plane* +intake*'],
    ['"headers" -carb +(timing)~ @8', '+headers* +carb* +timing*'],
    ['a b', ''],
    // Shorter words are not in InnoDB's index (innodb_ft_min_token_size 3, MariaDB docs): requiring them would find nothing.
    ['V8 cam', '+cam*'],
    ['zündung 6,200', '+zündung* +200*'],
  ])('%j gives %j', (q, terms) => {
    expect(fullTextTerms(q)).toBe(terms)
  })

  it('keeps at most twelve words', () => {
    expect(fullTextTerms(Array.from({ length: 20 }, (_, i) => `word${i}`).join(' ')).split(' ')).toHaveLength(12)
  })
})
