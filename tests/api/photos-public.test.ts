// A photo becomes public when a published story uses it, and only then.
import { afterAll, describe, expect, it, vi } from 'vitest'
import { Client, signedIn } from '../support/http'
import { closeTestDb } from '../support/db'
import { DEMO, expectOk } from '../support/workspace'
import { fetchImage, makeJpeg, photoTestTimeouts, uploadPhoto, waitForPhoto } from '../support/photos'
import { createStory, publishStory, storyBench, storyBody } from '../support/stories'

// Waits for photo sizing: timeouts from the one bound for a loaded machine (tests/support/photos.ts).
vi.setConfig(photoTestTimeouts(1))

afterAll(closeTestDb)

describe('photos of published stories', () => {
  it('are 404 to anonymous readers until the story using them is published, then served', async () => {
    const editor = await signedIn(DEMO.editor)
    const bench = await storyBench(editor)
    const uploaded = await uploadPhoto(editor, bench.benchTestId, await makeJpeg(800, 600), 'install.jpg')
    expect(uploaded.status).toBe(201)
    const ready = await waitForPhoto(editor, bench.benchTestId, uploaded.body.photo.id)
    expect(ready.status).toBe('ready')
    expectOk(await editor.patch(`/api/photos/${ready.id}`, { altText: 'The header collector on the test engine', version: ready.version }))

    const body = storyBody(bench, `\n::photo{id=${ready.id}}\n::\n`)
    const story = await createStory(editor, bench.benchTestId, { body })
    const anonymous = new Client()
    expect((await fetchImage(anonymous, `/photos/${ready.id}/480`)).status).toBe(404)

    await publishStory(editor, story.id)

    const image = await fetchImage(anonymous, `/photos/${ready.id}/480`)
    expect(image.status).toBe(200)
    expect(image.headers.get('content-type')).toBe('image/jpeg')
    expect(image.headers.get('x-content-type-options')).toBe('nosniff')
    // The original stays private even now.
    expect((await fetchImage(anonymous, `/photos/${ready.id}/original`)).status).toBe(404)
  })
})
