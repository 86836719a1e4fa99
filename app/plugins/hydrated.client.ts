// Marks the page once Vue has hydrated it (every suspended page resolved), so
// browser tests can wait for handlers to exist instead of racing them.
export default defineNuxtPlugin((nuxtApp) => {
  nuxtApp.hook('app:suspense:resolve', () => {
    document.documentElement.dataset.hydrated = 'true'
  })
})
