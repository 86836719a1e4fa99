// Whether anyone on the network can list the bucket without credentials: photos'
// originals (with their EXIF) and every pull file live there, so it must answer 403.
import { anonymousListUrl } from './bucket-listing'

export type ListingCheck = 'private' | 'public' | 'unknown'
let lastCheck: ListingCheck = 'unknown'

export function bucketListingCheck(): ListingCheck {
  return lastCheck
}

/** One unsigned ListObjectsV2 request; 'unknown' when the store did not answer. */
export async function checkAnonymousListing(): Promise<ListingCheck> {
  try {
    const res = await fetch(anonymousListUrl(appConfig().s3), { signal: AbortSignal.timeout(5000) })
    const text = await res.text()
    lastCheck = res.ok && /<ListBucketResult/.test(text) ? 'public' : 'private'
  }
  catch {
    lastCheck = 'unknown'
  }
  return lastCheck
}
