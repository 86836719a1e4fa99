import { createHash } from 'node:crypto'
import { existsSync, readdirSync, readFileSync, statSync, writeFileSync } from 'node:fs'
import { join, relative } from 'node:path'
import { ROOT } from './env'
import { runInherit } from './proc'

const SOURCES = ['app', 'server', 'shared', 'content', 'public', 'nuxt.config.ts', 'tailwind.config.ts', 'content.config.ts', 'package-lock.json']
const STAMP = join(ROOT, '.output', '.source-hash')

function* files(path: string): Generator<string> {
  if (!existsSync(path)) return
  if (statSync(path).isFile()) { yield path; return }
  for (const entry of readdirSync(path).sort()) yield* files(join(path, entry))
}

/** A hash of everything the build reads, so a build is skipped only when nothing changed. */
function sourceHash(): string {
  const hash = createHash('sha256')
  for (const source of SOURCES) {
    for (const file of files(join(ROOT, source))) {
      hash.update(relative(ROOT, file)).update('\0').update(readFileSync(file))
    }
  }
  return hash.digest('hex')
}

export async function buildIfNeeded(): Promise<void> {
  const hash = sourceHash()
  if (existsSync(STAMP) && readFileSync(STAMP, 'utf8') === hash && existsSync(join(ROOT, '.output', 'server', 'cluster.mjs'))) {
    console.log('build: up to date')
    return
  }
  console.log('build: building the app (about a minute)...')
  const code = await runInherit(join(ROOT, 'node_modules', '.bin', 'nuxi'), ['build'], { cwd: ROOT, env: { ...process.env, NODE_ENV: 'production' } })
  if (code !== 0) throw new Error(`nuxi build failed with exit code ${code}`)
  writeFileSync(STAMP, hash)
}
