// The desk's content collection (the writers' style guide) is not readable by anyone
// else through the content module's own addresses: its SQL dump (which was a public
// file) and its query route, under every spelling tried here.
import { describe, expect, it } from 'vitest'
import { BASE_URL, Client, signedIn } from '../support/http'
import { DEMO } from '../support/workspace'

const STAFF_QUERY = 'SELECT * FROM _content_staff ORDER BY stem ASC'
const MARKER = 'Writers\' style guide'

async function get(path: string, client?: Client) {
  const res = await fetch(BASE_URL + path, { headers: client?.cookie ? { cookie: client.cookie } : {} })
  return { status: res.status, text: await res.text(), cacheControl: res.headers.get('cache-control') ?? '' }
}

async function query(collection: string, sql: string, client = new Client()) {
  const res = await client.request('POST', `/__nuxt_content/${collection}/query`, { json: { sql } })
  return { status: res.status, text: JSON.stringify(res.body) }
}

describe('the staff collection through the content module\'s own routes', () => {
  it('the desk reads it (so the style guide page keeps working)', async () => {
    const writer = await signedIn(DEMO.writer)
    const dump = await get('/__nuxt_content/staff/sql_dump.txt', writer)
    expect(dump.status).toBe(200)
    expect(dump.text.length).toBeGreaterThan(100)
    expect(dump.cacheControl).toMatch(/no-store/)
    const rows = await query('staff', STAFF_QUERY, writer)
    expect(rows.status).toBe(200)
    expect(rows.text).toContain(MARKER)
  })

  it('anonymous visitors and readers get 404 on the dump and the query route, under every spelling', async () => {
    const reader = await signedIn(DEMO.reader)
    const dumpPaths = [
      '/__nuxt_content/staff/sql_dump.txt',
      '/__nuxt_content/staff/sql_dump.txt?v=anything',
      '/__nuxt_content/staff/sql_dump.txt/',
      '/__nuxt_content/%73taff/sql_dump.txt',
      '/__nuxt_content/staff%2Fsql_dump.txt',
      '/__nuxt_content/STAFF/sql_dump.txt',
    ]
    for (const who of [undefined, reader]) {
      for (const path of dumpPaths) {
        const res = await get(path, who)
        expect(res.status, `${path} ${who ? 'reader' : 'anonymous'}`).not.toBe(200)
      }
      const rows = await query('staff', STAFF_QUERY, who)
      expect(rows.status).toBe(404)
      expect(rows.text).not.toContain(MARKER)
    }
  })

  it('the public collection\'s query route does not reach the staff table', async () => {
    for (const sql of [
      STAFF_QUERY,
      'SELECT * FROM _content_pages WHERE (path IN (SELECT path FROM _content_staff)) ORDER BY stem ASC',
      'SELECT * FROM _content_pages WHERE (1=1) UNION SELECT * FROM _content_staff ORDER BY stem ASC',
    ]) {
      const rows = await query('pages', sql)
      expect(rows.status, sql).not.toBe(200)
      expect(rows.text).not.toContain(MARKER)
    }
    // The public pages stay public.
    expect((await get('/__nuxt_content/pages/sql_dump.txt')).status).toBe(200)
  })
})
