// The reader's base query over the stories table: what every list, the search and the
// feeds start from.
import type { Db } from '../../utils/db'

/**
 * Published stories joined with the edition readers see (`edition.*`): what a reader
 * is shown of a story's text anywhere (cards, search, feeds) comes from there, never
 * from the live row an editor may be changing. A story put live without an edition
 * (set by hand, or before editions existed) has only its row.
 */
export function publicStories(db: Db) {
  return db('stories').where('stories.state', 'published')
    .leftJoin('story_editions as edition', 'edition.id', 'stories.published_edition_id')
}

/** The published headline and deck, as columns of a publicStories() query. */
export function publishedTextColumns(db: Db) {
  return [
    db.raw('COALESCE(edition.headline, stories.headline) AS headline'),
    db.raw('COALESCE(edition.deck, stories.deck) AS deck'),
  ]
}
