import type { ListingCheck } from '../utils/storage-privacy'
// At start, the server checks that the bucket cannot be listed without credentials and
// warns loudly when it can. With the demo's local s3rver (PULLSHEET_DEMO=1) it can, and
// the warning says that this stand-in is for development only.
export default defineNitroPlugin(() => {
  if (import.meta.dev || import.meta.prerender || process.env.PULLSHEET_STORAGE_CHECK === '0') return
  void checkAnonymousListing().then((result: ListingCheck) => {
    if (result !== 'public') return
    const bucket = appConfig().s3.bucket
    if (appConfig().demo) {
      console.warn(`[storage] bucket "${bucket}" can be listed without credentials: expected of the local s3rver stand-in, which is for development only. A production bucket must be private.`)
    }
    else {
      console.warn(`[storage] WARNING: anyone can list bucket "${bucket}" without credentials (anonymous ListObjects answered 200). Photos' originals and pull files are readable by anyone who finds them. Make the bucket private: block public access and remove any public-read or anonymous-list policy. See README "Production storage".`)
    }
  })
})
