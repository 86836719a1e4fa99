// Creations racing for one slug: each takes the next free one, none fails.
import { afterAll, describe, expect, it } from 'vitest'
import { closeTestDb } from '../support/db'
import { createBenchTest, expectOk, newWriter } from '../support/workspace'

afterAll(closeTestDb)

describe('slugs taken in parallel', () => {
  it('gives ten bench tests with one title ten slugs, all created', async () => {
    const writer = (await newWriter()).client
    const title = `Race bench ${Date.now().toString(36)}`
    const replies = await Promise.all(Array.from({ length: 10 }, () => writer.post('/api/bench-tests', { title, engineFamily: 'pushrod-v8', partType: 'exhaust' })))
    expect(replies.map(r => r.status)).toEqual(Array(10).fill(201))
    expect(new Set(replies.map(r => r.body.benchTest.slug)).size).toBe(10)
  })

  it('gives ten stories with one headline ten slugs, all created', async () => {
    const writer = (await newWriter()).client
    const bench = await createBenchTest(writer)
    const headline = `Race story ${Date.now().toString(36)}`
    const replies = await Promise.all(Array.from({ length: 10 }, () => writer.post('/api/stories', { benchTestId: bench.id, headline })))
    expect(replies.map(r => r.status)).toEqual(Array(10).fill(201))
    const slugs = replies.map(r => expectOk(r, 201).story.slug as string)
    expect(new Set(slugs).size).toBe(10)
  })
})
