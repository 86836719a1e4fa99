/**
 * @nuxt/content collections for the desk only (writers, editors, admins). Their
 * database dump is not prerendered into the public files (nuxt.config.ts), and
 * server/middleware/03.content-privacy.ts answers 404 to anyone else on every
 * /__nuxt_content/<collection>/ address (the dump, the query route).
 */
export const STAFF_COLLECTIONS: readonly string[] = ['staff']
