// A page whose data could not be read (the database away, a failing service) is
// not the page: it answers 503 with Retry-After, and neither the page cache nor a
// proxy keeps it. Before this, the front page answered 200 with no stories during
// an outage and stayed cached for minutes after.
export default defineNuxtPlugin({
  name: 'data-outage',
  setup(nuxtApp) {
    nuxtApp.hooks.hook('app:rendered', ({ ssrContext }) => {
      const event = ssrContext?.event
      if (!event) return
      // payload._errors is where Nuxt keeps each failed useAsyncData/useFetch call of the
      // render; it has no public hook for "this page's data failed", so this one plugin
      // reads it (no composable does), and a Nuxt upgrade is checked by the outage drill
      // (tests/api/zz-faults-outage-pages.test.ts).
      const failed = Object.values(nuxtApp.payload._errors ?? {}).some(error => error && (error.status ?? error.statusCode ?? 500) >= 500)
      if (!failed) return
      event.context.pageCache = undefined
      setResponseStatus(event, 503, 'Service Unavailable')
      event.node.res.setHeader('Cache-Control', 'no-store')
      event.node.res.setHeader('Retry-After', '10')
    })
  },
})
