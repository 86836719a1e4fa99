// The magazine's time zone travels to the browser in the page's payload, so the server
// render and the browser print every time in the same zone (no hydration mismatch).
export default defineNuxtPlugin(async () => {
  const zone = useSiteTimeZone()
  const read = useRequestEvent()?.context.renderData?.siteTimeZone
  if (read) zone.value = await read()
})
