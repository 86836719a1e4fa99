// Fixtures for the workspace API tests: fresh writers (so tests never share
// ownership), bench tests with setups, and synthetic pull files from shared/dyno's
// documented model (invented data).
import { syntheticPull, type SyntheticPullOptions } from '#shared/dyno'
import { Client, signedIn, uniqueEmail } from './http'

export const DEMO = { reader: 'reader@example.com', writer: 'writer@example.com', editor: 'editor@example.com', admin: 'admin@example.com' } as const
const PASSWORD = 'a-long-test-password'

export async function newWriter(role: 'writer' | 'reader' | 'editor' = 'writer'): Promise<{ client: Client, id: number, email: string }> {
  const admin = await signedIn(DEMO.admin)
  const email = uniqueEmail(role)
  const res = await admin.post('/api/users', { email, displayName: `Test ${role}`, role, password: PASSWORD })
  if (res.status !== 201) throw new Error(`creating a ${role} failed: ${res.status} ${JSON.stringify(res.body)}`)
  return { client: await signedIn(email, PASSWORD), id: res.body.user.id, email }
}

export function expectOk<T = any>(res: { status: number, body: T }, status = 200): T {
  if (res.status !== status) throw new Error(`expected ${status}, got ${res.status}: ${JSON.stringify(res.body).slice(0, 600)}`)
  return res.body
}

export async function createBenchTest(client: Client, title = `Test bench ${Math.random().toString(36).slice(2, 8)}`) {
  return expectOk(await client.post('/api/bench-tests', { title, engineFamily: 'pushrod-v8', partType: 'exhaust', shop: 'Test shop (invented)' }), 201).benchTest
}

export async function createSetup(client: Client, benchTestId: number, label: string, extra: Record<string, unknown> = {}) {
  return expectOk(await client.post(`/api/bench-tests/${benchTestId}/setups`, { label, ...extra }), 201).setup
}

export const V8_MODEL = { peakTorqueLbFt: 430, peakTorqueRpm: 4400, widthLowRpm: 2600, widthHighRpm: 1900 }

export function pullCsv(opts: Partial<SyntheticPullOptions> & { seed: number }) {
  return syntheticPull({ ...V8_MODEL, fromRpm: 3000, toRpm: 6000, stepRpm: 20, ...opts })
}

/** A synthetic pull with a coolant channel added (the operator's dyno logs it as an extra column). */
export function withCoolant(csv: string, coolantF: number): string {
  const lines = csv.split('\r\n')
  const header = lines.findIndex(l => l.startsWith('RPM'))
  return lines.map((l, i) => (i === header ? `${l},Coolant (F)` : i > header && l ? `${l},${coolantF}` : l)).join('\r\n')
}

/** One pull file ready for the import body, assigned to a setup with the weather its file states. */
export function pullFile(name: string, setupId: number, opts: Partial<SyntheticPullOptions> & { seed: number }) {
  const pull = pullCsv(opts)
  return { name, text: pull.csv, setupId, weather: pull.weather }
}

export async function importFiles(client: Client, benchTestId: number, files: unknown[]) {
  return client.post(`/api/bench-tests/${benchTestId}/pulls/import`, { files })
}

/** A multipart upload as the operator's browser or script sends it (no cookie, no Origin). */
export async function uploadFiles(token: string, files: { name: string, text: string | Uint8Array<ArrayBuffer> }[], base = new Client().base) {
  const form = new FormData()
  for (const f of files) form.append('file', new Blob([f.text]), f.name)
  const res = await fetch(`${base}/api/upload/${token}`, { method: 'POST', body: form })
  const text = await res.text()
  let body: any = text
  try { body = JSON.parse(text) }
  catch { /* not JSON */ }
  return { status: res.status, body, headers: res.headers }
}
