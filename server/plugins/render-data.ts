import { MagazineSlugParams } from '~~/server/services/magazine/lists'
import { getSiteSettings } from '~~/server/services/magazine/settings'
import { readerStoryFor } from '~~/server/services/magazine/story'
// A server render used to read the user and the story through the app's own API:
// an internal request each, with its own event, runtime config copy, session
// unsealing and JSON both ways, about a fifth of an uncached story page. The render
// now calls the same services the routes call (app/composables/useCurrentUser.ts,
// useStoryPage.ts); the browser still uses the API.
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('request', (event) => {
    event.context.renderData = {
      // The database being away is a 503 for the page, as it is for the API.
      currentUser: () => getCurrentUser(event).catch((error) => { throw outageAs503(error) }),
      readerStory: async (slug) => {
        // The route's own parameter check; a malformed slug is simply no story here.
        const params = MagazineSlugParams.safeParse({ slug })
        if (!params.success) throw createError({ statusCode: 404, statusMessage: 'Not Found', message: 'No such story.' })
        return readerStoryFor(useDb(), event, params.data.slug).catch((error) => { throw outageAs503(error) })
      },
      siteTimeZone: async () => (await getSiteSettings(useDb())).timeZone,
    }
  })
})
