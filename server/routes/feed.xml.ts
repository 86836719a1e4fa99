// RSS 2.0 of the newest published stories.
export default defineEventHandler(async (event) => {
  setResponseHeader(event, 'content-type', 'application/rss+xml; charset=utf-8')
  return rssFeedXml(useAppConfig().magazine.name)
})
