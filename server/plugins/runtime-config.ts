// Nitro gives every request its own copy of the runtime config, re-reading the
// environment for each of its keys (useRuntimeConfig(event)); nothing here changes
// the config per request, and the environment is read once at start, so every
// request shares one copy made then. That copy was 3 % of an uncached story page.
export default defineNitroPlugin((nitroApp) => {
  const shared = structuredClone(useRuntimeConfig())
  nitroApp.hooks.hook('request', (event) => {
    event.context.nitro ??= { errors: [] }
    event.context.nitro.runtimeConfig ??= shared
  })
})
