// A signed-in HTTP client for the demo seed: keeps the session cookie and sends the
// Origin header a browser sends (the server's CSRF check wants it), and fails loudly
// with the server's own message when a request is refused.
export class DemoClient {
  private cookie = ''
  constructor(readonly base: string) {}

  async request<T>(method: string, path: string, body?: unknown, okStatus = [200, 201]): Promise<T> {
    const headers: Record<string, string> = { accept: 'application/json' }
    if (this.cookie) headers.cookie = this.cookie
    if (method !== 'GET') headers.origin = new URL(this.base).origin
    let payload: BodyInit | undefined
    if (body instanceof FormData) payload = body
    else if (body !== undefined) {
      headers['content-type'] = 'application/json'
      payload = JSON.stringify(body)
    }
    const res = await fetch(this.base + path, { method, headers, body: payload, redirect: 'manual' })
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(';')
      if (pair?.startsWith('pullsheet-session=')) this.cookie = pair
    }
    const text = await res.text()
    if (!okStatus.includes(res.status)) throw new Error(`demo seed: ${method} ${path} answered ${res.status}: ${text.slice(0, 400)}`)
    return (text ? JSON.parse(text) : null) as T
  }

  get<T>(path: string) { return this.request<T>('GET', path) }
  post<T>(path: string, body: unknown = {}) { return this.request<T>('POST', path, body) }
  patch<T>(path: string, body: unknown) { return this.request<T>('PATCH', path, body) }

  static async signedIn(base: string, email: string, password: string): Promise<DemoClient> {
    const client = new DemoClient(base)
    await client.post('/api/auth/login', { email, password })
    return client
  }
}
