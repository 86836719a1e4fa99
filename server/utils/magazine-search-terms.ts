// The reader's search words as a MariaDB FULLTEXT boolean query (pure).

/** InnoDB's default innodb_ft_min_token_size: shorter words are not in the index. */
const MIN_TOKEN = 3

/**
 * FULLTEXT in boolean mode, every word required and matched as a prefix ("carb"
 * finds "carburetor"). Operators typed by the reader are stripped so they cannot
 * change the query's meaning; best match first, then newest.
 */
export function fullTextTerms(q: string): string {
  return q.split(/[^\p{L}\p{N}]+/u).filter(w => w.length >= MIN_TOKEN).slice(0, 12).map(w => `+${w}*`).join(' ')
}
