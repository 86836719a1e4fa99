import { FEED_CSP, rssFeedXml } from '~~/server/services/magazine/feeds'
// RSS 2.0 of the newest published stories.
export default defineEventHandler(async (event) => {
  // application/xml rather than rss+xml: browsers show it (styled by /feed.css) instead of
  // offering a download, and feed readers take either.
  setResponseHeader(event, 'content-type', 'application/xml; charset=utf-8')
  setResponseHeader(event, 'content-security-policy', FEED_CSP)
  return rssFeedXml(useDb(), useAppConfig().magazine.name)
})
