// Loads the signed-in user before the first route middleware and page render, so
// the header, the pages and the role middleware all read one answer.
export default defineNuxtPlugin({
  name: 'current-user',
  async setup() {
    await fetchCurrentUser()
  },
})
