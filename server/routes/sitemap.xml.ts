import { sitemapXml } from '~~/server/services/magazine/feeds'
// The site pages and every published story, for search engines.
export default defineEventHandler(async (event) => {
  setResponseHeader(event, 'content-type', 'application/xml; charset=utf-8')
  return sitemapXml(useDb())
})
