// A small HTTP client for API tests: keeps the session cookie like a browser
// and sends the Origin header a browser would, unless a test says otherwise.
export const BASE_URL = process.env.TEST_BASE_URL ?? 'http://127.0.0.1:3010'

// Tests that start extra app servers take ports just above the main one, so two
// checkouts with different TEST_PORTs can run their tests side by side.
export function spareAppPort(offset: number): number {
  return Number(new URL(BASE_URL).port) + offset
}

/** The settings `npm test` gives its app server, for the extra ones a test starts. */
export function testServerExtra(): Record<string, string> {
  return JSON.parse(process.env.TEST_SERVER_EXTRA ?? '{}') as Record<string, string>
}

export interface Reply<T = any> { status: number, body: T, headers: Headers }

export class Client {
  cookie = ''
  constructor(readonly base = BASE_URL) {}

  async request<T = any>(method: string, path: string, opts: { json?: unknown, origin?: string | null, headers?: Record<string, string>, body?: BodyInit } = {}): Promise<Reply<T>> {
    const headers: Record<string, string> = { accept: 'application/json', ...opts.headers }
    if (this.cookie) headers.cookie = this.cookie
    if (method !== 'GET' && opts.origin !== null) headers.origin = opts.origin ?? new URL(this.base).origin
    let body = opts.body
    if (opts.json !== undefined) {
      headers['content-type'] = 'application/json'
      body = JSON.stringify(opts.json)
    }
    const res = await fetch(this.base + path, { method, headers, body, redirect: 'manual' })
    const setCookie = res.headers.getSetCookie()
    for (const c of setCookie) {
      const [pair] = c.split(';')
      const [name] = pair!.split('=')
      if (name === 'pullsheet-session') this.cookie = /=\s*$/.test(pair!) || /Max-Age=0/i.test(c) ? '' : pair!
    }
    const text = await res.text()
    let parsed: unknown = text
    try { parsed = text ? JSON.parse(text) : null }
    catch { /* not JSON */ }
    return { status: res.status, body: parsed as T, headers: res.headers }
  }

  get<T = any>(path: string) { return this.request<T>('GET', path) }
  post<T = any>(path: string, json?: unknown, opts: { origin?: string | null } = {}) { return this.request<T>('POST', path, { json: json ?? {}, ...opts }) }
  patch<T = any>(path: string, json?: unknown, opts: { origin?: string | null } = {}) { return this.request<T>('PATCH', path, { json: json ?? {}, ...opts }) }
  delete<T = any>(path: string, opts: { origin?: string | null } = {}) { return this.request<T>('DELETE', path, opts) }
}

export const DEMO_PASSWORD = 'pullsheet-demo'

export async function signedIn(email: string, password = DEMO_PASSWORD): Promise<Client> {
  const client = new Client()
  const res = await client.post('/api/auth/login', { email, password })
  if (res.status !== 200) throw new Error(`login as ${email} failed: ${res.status} ${JSON.stringify(res.body)}`)
  return client
}

/** A unique address per call, so tests never collide with each other or with the demo. */
export function uniqueEmail(prefix = 'user'): string {
  return `${prefix}-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 8)}@test.example`
}
