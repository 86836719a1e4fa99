// Local stand-in for S3 (s3rver), run as its own process by scripts/lib/services.ts.
import S3rver from 's3rver'

const port = Number(process.env.S3_PORT)
const directory = process.env.S3_DATA_DIR!
const bucket = process.env.S3_BUCKET ?? 'pullsheet'

const server = new S3rver({ port, address: '127.0.0.1', directory, silent: true, configureBuckets: [{ name: bucket, configs: [] }] })
await server.run()
console.log(`storage: s3rver on http://127.0.0.1:${port} bucket ${bucket}`)
const stop = () => { server.close().finally(() => process.exit(0)) }
process.on('SIGTERM', stop)
process.on('SIGINT', stop)
