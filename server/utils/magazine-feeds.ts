// RSS and the sitemap: published stories only, absolute URLs from BASE_URL.
import { escapeHtml } from '#shared/utils/escape-html'

// XML 1.0 has no way to write most control characters: drop them, then escape.
// eslint-disable-next-line no-control-regex
const escapeXml = (value: string) => escapeHtml(value.replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/g, ''))

export const FEED_LIMIT = 50

interface FeedRow { slug: string, headline: string, deck: string, published_at: Date | string, updated_at: Date | string }

export function publicStoryUrl(slug: string): string {
  return `${appConfig().baseUrl}/stories/${encodeURIComponent(slug)}`
}

export async function rssFeedXml(magazineName: string): Promise<string> {
  const rows = await publicStories(useDb()).orderBy('published_at', 'desc').orderBy('id', 'desc').limit(FEED_LIMIT)
    .select('slug', 'headline', 'deck', 'published_at', 'updated_at') as FeedRow[]
  const base = appConfig().baseUrl
  const items = rows.map(r => [
    '    <item>',
    `      <title>${escapeXml(r.headline)}</title>`,
    `      <link>${escapeXml(publicStoryUrl(r.slug))}</link>`,
    `      <guid isPermaLink="true">${escapeXml(publicStoryUrl(r.slug))}</guid>`,
    `      <description>${escapeXml(r.deck)}</description>`,
    `      <pubDate>${new Date(r.published_at).toUTCString()}</pubDate>`,
    '    </item>',
  ].join('\n'))
  return [
    '<?xml version="1.0" encoding="UTF-8"?>',
    '<rss version="2.0" xmlns:atom="http://www.w3.org/2005/Atom">',
    '  <channel>',
    `    <title>${escapeXml(magazineName)}</title>`,
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

export async function sitemapXml(): Promise<string> {
  const rows = await publicStories(useDb()).orderBy('published_at', 'desc').select('slug', 'updated_at') as Pick<FeedRow, 'slug' | 'updated_at'>[]
  const base = appConfig().baseUrl
  const pages = ['/', '/how-we-test', '/cautions', '/about'].map(p => `  <url><loc>${escapeXml(base + p)}</loc></url>`)
  const stories = rows.map(r => `  <url><loc>${escapeXml(publicStoryUrl(r.slug))}</loc><lastmod>${new Date(r.updated_at).toISOString()}</lastmod></url>`)
  return ['<?xml version="1.0" encoding="UTF-8"?>', '<urlset xmlns="http://www.sitemaps.org/schemas/sitemap/0.9">', ...pages, ...stories, '</urlset>', ''].join('\n')
}
