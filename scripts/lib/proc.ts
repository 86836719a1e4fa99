import { spawn, type ChildProcess, type SpawnOptions } from 'node:child_process'
import { createConnection } from 'node:net'

export function sleep(ms: number): Promise<void> {
  return new Promise(r => setTimeout(r, ms))
}

/** True when something accepts TCP connections on 127.0.0.1:port. */
export function portOpen(port: number, host = '127.0.0.1'): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = createConnection({ port, host })
    socket.once('connect', () => { socket.destroy(); resolve(true) })
    socket.once('error', () => resolve(false))
    socket.setTimeout(1000, () => { socket.destroy(); resolve(false) })
  })
}

export async function waitFor(what: string, check: () => Promise<boolean>, timeoutMs = 30_000): Promise<void> {
  const until = Date.now() + timeoutMs
  while (Date.now() < until) {
    if (await check()) return
    await sleep(150)
  }
  throw new Error(`${what} did not come up within ${timeoutMs / 1000} s`)
}

/** Runs a command to completion; rejects with its output when it fails. */
export function run(cmd: string, args: string[], opts: SpawnOptions & { input?: string, quiet?: boolean } = {}): Promise<string> {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { ...opts, stdio: ['pipe', 'pipe', 'pipe'] })
    let out = ''
    child.stdout?.on('data', (d) => { out += d; if (!opts.quiet) process.stdout.write(d) })
    child.stderr?.on('data', (d) => { out += d; if (!opts.quiet) process.stderr.write(d) })
    child.on('error', reject)
    child.on('close', (code) => {
      if (code === 0) resolve(out)
      else reject(new Error(`${cmd} ${args.join(' ')} exited with ${code}\n${out}`))
    })
    // A command that exits before reading its input must not crash us with EPIPE.
    child.stdin?.on('error', () => {})
    child.stdin?.end(opts.input ?? '')
  })
}

/** Inherits the output; resolves with the exit code. */
export function runInherit(cmd: string, args: string[], opts: SpawnOptions = {}): Promise<number> {
  return new Promise((resolve, reject) => {
    const child = spawn(cmd, args, { stdio: 'inherit', ...opts })
    child.on('error', reject)
    child.on('close', code => resolve(code ?? 1))
  })
}

/**
 * Children are started in their own process group so Ctrl-C reaches only us;
 * we then stop them in order (app, mail, storage, database).
 */
export function startDetached(cmd: string, args: string[], opts: SpawnOptions = {}): ChildProcess {
  return spawn(cmd, args, { stdio: 'inherit', detached: true, ...opts })
}

export function killGroup(child: ChildProcess, signal: NodeJS.Signals = 'SIGTERM'): Promise<void> {
  return new Promise((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null || !child.pid) return resolve()
    const timer = setTimeout(() => {
      try { process.kill(-child.pid!, 'SIGKILL') }
      catch { /* gone */ }
    }, 5000)
    child.once('exit', () => { clearTimeout(timer); resolve() })
    try { process.kill(-child.pid, signal) }
    catch { clearTimeout(timer); resolve() }
  })
}
