// The address an anonymous visitor would use to list a bucket's objects (S3
// ListObjectsV2, unsigned): path-style under the endpoint (s3rver and most
// on-premises stores), virtual-host style otherwise (AWS: <bucket>.s3.<region>.amazonaws.com).

export interface BucketAddress {
  endpoint?: string
  region: string
  bucket: string
  forcePathStyle: boolean
}

export function anonymousListUrl(s3: BucketAddress): string {
  const query = '?list-type=2&max-keys=1'
  if (!s3.endpoint) return `https://${s3.bucket}.s3.${s3.region}.amazonaws.com/${query}`
  const base = new URL(s3.endpoint)
  const path = base.pathname.replace(/\/+$/, '')
  if (s3.forcePathStyle) return `${base.origin}${path}/${encodeURIComponent(s3.bucket)}${query}`
  return `${base.protocol}//${s3.bucket}.${base.host}${path}/${query}`
}
