import { HeadBucketCommand, S3Client } from '@aws-sdk/client-s3'

let client: S3Client | undefined

/** One S3 client per process, against the configured endpoint (s3rver locally). */
export function useS3(): S3Client {
  if (!client) {
    const { s3 } = appConfig()
    client = new S3Client({
      region: s3.region,
      endpoint: s3.endpoint,
      forcePathStyle: s3.forcePathStyle,
      credentials: s3.accessKeyId && s3.secretAccessKey ? { accessKeyId: s3.accessKeyId, secretAccessKey: s3.secretAccessKey } : undefined,
      maxAttempts: 2,
      requestHandler: { connectionTimeout: 3000, requestTimeout: 15000 },
    })
  }
  return client
}

export async function storageReachable(): Promise<boolean> {
  try {
    await useS3().send(new HeadBucketCommand({ Bucket: appConfig().s3.bucket }))
    return true
  }
  catch { return false }
}
