// Addresses of an unsigned ListObjectsV2 (AWS S3 API reference, "ListObjectsV2":
// GET /?list-type=2 on the bucket; path-style and virtual-hosted-style addressing as
// described in the S3 user guide, "Virtual hosting of buckets").
import { describe, expect, it } from 'vitest'
import { anonymousListUrl } from '../../../server/utils/bucket-listing'

describe('anonymousListUrl', () => {
  it('AWS without an endpoint: virtual-hosted style in the region', () => {
    expect(anonymousListUrl({ region: 'eu-west-1', bucket: 'desk-files', forcePathStyle: false }))
      .toBe('https://desk-files.s3.eu-west-1.amazonaws.com/?list-type=2&max-keys=1')
  })

  it('an S3-compatible endpoint with path style (s3rver, on-premises stores)', () => {
    expect(anonymousListUrl({ endpoint: 'http://127.0.0.1:4569', region: 'us-east-1', bucket: 'pullsheet', forcePathStyle: true }))
      .toBe('http://127.0.0.1:4569/pullsheet?list-type=2&max-keys=1')
    expect(anonymousListUrl({ endpoint: 'https://store.example.org/s3/', region: 'x', bucket: 'a b', forcePathStyle: true }))
      .toBe('https://store.example.org/s3/a%20b?list-type=2&max-keys=1')
  })

  it('an S3-compatible endpoint with virtual hosts', () => {
    expect(anonymousListUrl({ endpoint: 'https://objects.example.org:9000', region: 'x', bucket: 'pullsheet', forcePathStyle: false }))
      .toBe('https://pullsheet.objects.example.org:9000/?list-type=2&max-keys=1')
  })
})
