// RSS and the sitemap: published stories only (their published edition's words),
// absolute URLs from BASE_URL.
import type { Db } from '../../utils/db'
import { escapeHtml } from '../../utils/escape-html'
import { publicStories, publishedTextColumns } from './published'

// XML 1.0 has no way to write most control characters: drop them, then escape.
// eslint-disable-next-line no-control-regex
const escapeXml = (value: string) => escapeHtml(value.replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/g, ''))

export const FEED_LIMIT = 50

interface FeedRow { slug: string, headline: string, deck: string, published_at: Date | string, updated_at: Date | string }

export function publicStoryUrl(slug: string): string {
  return `${appConfig().baseUrl}/stories/${encodeURIComponent(slug)}`
}

// A browser opening the feed shows it styled by /feed.css, with a few XHTML elements
// (a namespace extension, which RSS 2.0 allows and feed readers skip) saying what the
// page is and linking each story. XSLT would do the same but is deprecated in browsers.
const XHTML = 'http://www.w3.org/1999/xhtml'

/** The feed's own CSP: nothing runs, only its stylesheet loads. */
export const FEED_CSP = `default-src 'none'; style-src 'self'; img-src 'self'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'`

export async function rssFeedXml(db: Db, magazineName: string): Promise<string> {
  const rows = await publicStories(db).orderBy('stories.published_at', 'desc').orderBy('stories.id', 'desc').limit(FEED_LIMIT)
    .select('stories.slug', ...publishedTextColumns(db), 'stories.published_at', 'stories.updated_at') as FeedRow[]
  const base = appConfig().baseUrl
  const items = rows.map(r => [
    '    <item>',
    `      <title>${escapeXml(r.headline)}</title>`,
    `      <link>${escapeXml(publicStoryUrl(r.slug))}</link>`,
    `      <guid isPermaLink="true">${escapeXml(publicStoryUrl(r.slug))}</guid>`,
    `      <description>${escapeXml(r.deck)}</description>`,
    `      <pubDate>${new Date(r.published_at).toUTCString()}</pubDate>`,
    `      <h:p><h:a href="${escapeXml(publicStoryUrl(r.slug))}">Read the story</h:a></h:p>`,
    '    </item>',
  ].join('\n'))
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<?xml-stylesheet type="text/css" href="/feed.css"?>',
    `<rss version="2.0" xmlns:atom="http://www.w3.org/2005/Atom" xmlns:h="${XHTML}">`,
    '  <channel>',
    `    <title>${escapeXml(magazineName)}</title>`,
    `    <h:p class="feed-about">This is the RSS feed of ${escapeXml(magazineName)}: put its address, <h:code>${escapeXml(base)}/feed.xml</h:code>, into a feed reader to hear of every new test. <h:a href="${escapeXml(base)}/">Back to the stories</h:a></h:p>`,
    `    <link>${escapeXml(base)}/</link>`,
    `    <atom:link href="${escapeXml(base)}/feed.xml" rel="self" type="application/rss+xml"/>`,
    '    <description>Engine-dyno parts tests from the tech desk (a fictional magazine made up for this demo).</description>',
    '    <language>en</language>',
    ...(rows[0] ? [`    <lastBuildDate>${new Date(rows[0].published_at).toUTCString()}</lastBuildDate>`] : []),
    ...items,
    '  </channel>',
    '</rss>',
    '',
  ].join('\n')
}

export async function sitemapXml(db: Db): Promise<string> {
  const rows = await publicStories(db).orderBy('stories.published_at', 'desc').select('stories.slug', 'stories.updated_at') as Pick<FeedRow, 'slug' | 'updated_at'>[]
  const base = appConfig().baseUrl
  const pages = ['/', '/how-we-test', '/cautions', '/about'].map(p => `  <url><loc>${escapeXml(base + p)}</loc></url>`)
  const stories = rows.map(r => `  <url><loc>${escapeXml(publicStoryUrl(r.slug))}</loc><lastmod>${new Date(r.updated_at).toISOString()}</lastmod></url>`)
  return ['<?xml version="1.0" encoding="UTF-8"?>', '<urlset xmlns="http://www.sitemaps.org/schemas/sitemap/0.9">', ...pages, ...stories, '</urlset>', ''].join('\n')
}
