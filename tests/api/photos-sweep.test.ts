import { afterAll, describe, expect, it, vi } from 'vitest'
import { closeTestDb, testDb } from '../support/db'
import { signedIn } from '../support/http'
import { bucketKeys, createBenchTest, deleteObject, makeJpeg, photoTestTimeouts, replaceObject, uploadPhoto, userId, waitForPhoto } from '../support/photos'

// Waits for photo sizing: timeouts from the one bound for a loaded machine (tests/support/photos.ts).
vi.setConfig(photoTestTimeouts(4))

afterAll(closeTestDb)

describe('orphan sweep', () => {
  it('deletes objects without a row, fails photos whose original is gone, and sizes again a photo missing a size', async () => {
    const admin = await signedIn('admin@example.com')
    const writer = await signedIn('writer@example.com')
    const bench = await createBenchTest(await userId(writer), 'Sweep')
    const upload = async (shade: number) => {
      const res = await uploadPhoto(writer, bench, await makeJpeg(700, 400, () => [shade, 90, 90]), `sweep-${shade}.jpg`)
      return waitForPhoto(writer, bench, res.body.photo.id)
    }
    const lostOriginal = await upload(30)
    const lostSize = await upload(160)
    const rowOf = (id: number) => testDb()('photos').where({ id }).first()

    const stray = `photos/${bench}/00000000-0000-4000-8000-000000000000/original`
    await replaceObject(stray, 'left behind by an upload whose row never came')
    await deleteObject((await rowOf(lostOriginal.id)).original_key)
    const lostKey = `${(await rowOf(lostSize.id)).storage_prefix}/w480.jpg`
    await deleteObject(lostKey)

    // The grace period protects uploads in flight; with it, nothing this new is touched.
    const careful = await admin.post('/api/admin/photos/sweep', {})
    expect(careful.status).toBe(200)
    expect(await bucketKeys(stray)).toEqual([stray])

    const sweep = await admin.post('/api/admin/photos/sweep', { graceSeconds: 0 })
    expect(sweep.status).toBe(200)
    expect(sweep.body.orphanObjectsDeleted).toBeGreaterThanOrEqual(1)
    expect(await bucketKeys(stray)).toEqual([])

    expect(await rowOf(lostOriginal.id)).toMatchObject({ status: 'failed', failure_reason: expect.stringMatching(/missing from storage/) })
    const again = await waitForPhoto(writer, bench, lostSize.id, p => p.status === 'ready' && p.processedAt !== lostSize.processedAt)
    expect(again.variants.map(v => v.width)).toEqual([480, 700])
    expect(await bucketKeys(lostKey)).toEqual([lostKey])
  })

  it('is for admins only', async () => {
    const writer = await signedIn('writer@example.com')
    expect((await writer.post('/api/admin/photos/sweep', { graceSeconds: 0 })).status).toBe(403)
  })
})
