import type { MagazineStoryResponse } from './magazine'
import type { CurrentUser } from './users'

/**
 * What a server render may read straight from the services (server/plugins/render-data.ts)
 * instead of calling the app's own API through an internal request. Each answers
 * exactly what the matching API route answers, with the same checks.
 */
export interface RenderData {
  /** GET /api/auth/me's user. */
  currentUser: () => Promise<CurrentUser | null>
  /** GET /api/magazine/stories/<slug>. */
  readerStory: (slug: string) => Promise<MagazineStoryResponse>
  /** The site setting timeZone (every time on the page is said in it). */
  siteTimeZone: () => Promise<string>
}

declare module 'h3' {
  interface H3EventContext {
    renderData?: RenderData
  }
}
