// The readers' search index (story_search_terms) and the query over it, over each
// story's published edition (its headline, deck and body). The index follows the
// published stories by version (an edition going live bumps it): before a search,
// any published story whose indexed version is not its current one is indexed
// again, whoever wrote it (the editor, the publish job, the demo seed, a test). A story that is no longer
// published keeps its rows; the query only ever joins published stories.
import type { Knex } from 'knex'
import type { Db } from '../../utils/db'
import { ENGINE_FAMILIES, PART_TYPES } from '#shared/types/catalog'
import { labelOf } from '#shared/catalog/labels'
import { queryTokens, storySearchTerms } from './search-terms'
import { proseLines } from '#shared/utils/story-markup'
import { publicStories, publishedTextColumns } from './published'

interface IndexedStory {
  id: number
  version: number
  headline: string
  deck: string
  body: string
  engine_family: string
  part_type: string
}

const INSERT_CHUNK = 500

/** Takes a story's words again, inside one short transaction that holds its doc row. */
async function indexStory(db: Db, storyId: number): Promise<void> {
  // READ COMMITTED: deleting one story's tokens must not gap-lock another story's inserts.
  await db.transaction(async (trx) => {
    // The doc row is the per-story lock: two servers catching up the same story take turns.
    await trx.raw('INSERT INTO story_search_docs (story_id, story_version) VALUES (?, 0) ON DUPLICATE KEY UPDATE story_id = story_id', [storyId])
    // The published edition's words: an edit not yet approved must not be findable.
    const row = await publicStories(trx).where('stories.id', storyId)
      .first('stories.id', 'stories.version', ...publishedTextColumns(trx), trx.raw('COALESCE(edition.body, stories.body) AS body'), 'stories.engine_family', 'stories.part_type') as IndexedStory | undefined
    if (!row) return
    const tags = (await trx('story_tags').where({ story_id: storyId }).pluck('tag')) as string[]
    const terms = storySearchTerms({
      headline: row.headline,
      deck: row.deck,
      body: proseLines(row.body).join('\n'),
      catalog: [row.part_type, labelOf(PART_TYPES, row.part_type), row.engine_family, labelOf(ENGINE_FAMILIES, row.engine_family), ...tags],
    })
    await trx('story_search_terms').where({ story_id: storyId }).delete()
    const rows = [...terms].map(([token, weight]) => ({ token, story_id: storyId, weight }))
    for (let i = 0; i < rows.length; i += INSERT_CHUNK) await trx('story_search_terms').insert(rows.slice(i, i + INSERT_CHUNK))
    await trx('story_search_docs').where({ story_id: storyId }).update({ story_version: row.version, indexed_at: trx.raw('NOW(3)') })
  }, { isolationLevel: 'read committed' })
}

/** Published stories whose words are missing or from an older version. */
function staleStories(db: Db): Promise<number[]> {
  return db('stories').leftJoin('story_search_docs', 'story_search_docs.story_id', 'stories.id')
    .where('stories.state', 'published')
    .where(q => q.whereNull('story_search_docs.story_id').orWhereRaw('story_search_docs.story_version <> stories.version'))
    .pluck('stories.id') as Promise<number[]>
}

let running: Promise<void> | null = null

/** Brings the index in step with the published stories; one run at a time per process. */
export function catchUpSearchIndex(db: Db): Promise<void> {
  running ??= (async () => {
    try {
      for (const id of await staleStories(db)) await indexStory(db, id)
    }
    finally { running = null }
  })()
  return running
}

/**
 * Published stories holding every query word at the start of one of their words,
 * with a score (per word, the weight of the best place it stands; summed), as a
 * subquery to join on stories.id. Null when the query has no word to look for.
 */
export function searchHits(db: Db, q: string): Knex.Raw | null {
  const tokens = queryTokens(q)
  if (tokens.length === 0) return null
  // Tokens hold only letters, digits and points, so none can act as a LIKE wildcard.
  const perWord = tokens.map(() => 'SELECT story_id, MAX(weight) AS w FROM story_search_terms WHERE token LIKE ? GROUP BY story_id')
  return db.raw(
    `(SELECT story_id, SUM(w) AS score FROM (${perWord.join(' UNION ALL ')}) AS per_word GROUP BY story_id HAVING COUNT(*) = ?) AS hits`,
    [...tokens.map(t => `${t}%`), tokens.length],
  )
}
