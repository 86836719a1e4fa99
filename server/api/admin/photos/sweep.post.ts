import { z } from 'zod'
import { sweepPhotoStorage } from '~~/server/services/photos/sweep'

// The orphan sweep on demand; the grace period keeps uploads in flight safe.
const Body = z.object({ graceSeconds: z.number().int().min(0).max(30 * 86400).default(3600) })

export default defineEventHandler(async (event) => {
  await requireRole(event, 'admin')
  const { graceSeconds } = await readValidatedBody(event, zodParser(Body))
  return sweepPhotoStorage(useDb(), graceSeconds)
})
