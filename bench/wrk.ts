// Load from wrk (Debian package), a C load generator that costs the two cores far
// less than a Node one, so the rows measure the servers. A Lua script adds headers
// and prints the summary as JSON; callers may add their own request/response code.
import { spawn } from 'node:child_process'
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'

export interface WrkOptions {
  connections: number
  seconds: number
  threads?: number
  headers?: Record<string, string>
  /** Lua code run in each thread's state (request(), response(), delay()...). */
  lua?: string
  /** Lua code run once in the main state (setup(thread)). */
  luaSetup?: string
}

export interface WrkResult {
  requests: number
  perSecond: number
  /** Milliseconds. */
  p50: number
  p95: number
  p99: number
  max: number
  bytesPerRequest: number
  /** Non-2xx/3xx answers. */
  badStatus: number
  /** Connect, read, write errors and timeouts. */
  socketErrors: number
}

const luaString = (s: string) => `"${s.replace(/\\/g, '\\\\').replace(/"/g, '\\"')}"`

export async function wrk(url: string, opts: WrkOptions): Promise<WrkResult> {
  const dir = mkdtempSync(join(tmpdir(), 'pullsheet-wrk-'))
  const script = join(dir, 'bench.lua')
  writeFileSync(script, `
${Object.entries(opts.headers ?? {}).map(([k, v]) => `wrk.headers[${luaString(k)}] = ${luaString(v)}`).join('\n')}
${opts.luaSetup ?? ''}
${opts.lua ?? ''}
done = function(summary, latency, requests)
  local e = summary.errors
  io.write(string.format('WRK-JSON {"requests":%d,"duration_us":%d,"bytes":%d,"p50":%d,"p95":%d,"p99":%d,"max":%d,"status":%d,"socket":%d}\\n',
    summary.requests, summary.duration, summary.bytes, latency:percentile(50), latency:percentile(95), latency:percentile(99), latency.max,
    e.status, e.connect + e.read + e.write + e.timeout))
end
`)
  const args = ['-t', String(opts.threads ?? Math.min(2, opts.connections)), '-c', String(opts.connections), '-d', `${opts.seconds}s`, '--timeout', '10s', '-s', script, url]
  try {
    const out = await new Promise<string>((resolve, reject) => {
      const child = spawn('wrk', args, { stdio: ['ignore', 'pipe', 'inherit'] })
      let text = ''
      child.stdout.on('data', (chunk: Buffer) => { text += chunk.toString() })
      child.on('error', reject)
      child.on('close', code => (code === 0 ? resolve(text) : reject(new Error(`wrk exited ${code}: ${text}`))))
    })
    const line = out.split('\n').find(l => l.startsWith('WRK-JSON '))
    if (!line) throw new Error(`wrk printed no summary:\n${out}`)
    const r = JSON.parse(line.slice('WRK-JSON '.length)) as { requests: number, duration_us: number, bytes: number, p50: number, p95: number, p99: number, max: number, status: number, socket: number }
    return {
      requests: r.requests,
      perSecond: r.requests / (r.duration_us / 1e6),
      p50: r.p50 / 1000,
      p95: r.p95 / 1000,
      p99: r.p99 / 1000,
      max: r.max / 1000,
      bytesPerRequest: r.requests ? r.bytes / r.requests : 0,
      badStatus: r.status,
      socketErrors: r.socket,
    }
  }
  finally {
    rmSync(dir, { recursive: true, force: true })
  }
}

/** Throws when a row had failed answers: a fast wrong answer is no result. */
export function clean(name: string, r: WrkResult): WrkResult {
  if (r.badStatus || r.socketErrors) throw new Error(`${name}: ${r.badStatus} non-2xx/3xx answers, ${r.socketErrors} socket errors`)
  return r
}
