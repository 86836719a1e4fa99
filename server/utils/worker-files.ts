import { existsSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath } from 'node:url'

const found = new Map<string, string | undefined>()

/**
 * Where a worker file is: beside the built server (.output/server/workers/, put there
 * by the build hook in nuxt.config.ts) or in the sources during development. Searched
 * upwards from this chunk, whose depth inside .output varies. undefined when missing.
 */
export function findWorkerFile(fileName: string, override?: string): string | undefined {
  if (found.has(fileName)) return found.get(fileName)
  const relative = join('workers', fileName)
  const candidates: string[] = override ? [override] : []
  for (let dir = dirname(fileURLToPath(import.meta.url)), i = 0; i < 6; dir = dirname(dir), i++) {
    candidates.push(join(dir, relative), join(dir, 'server', relative))
  }
  const file = candidates.find(existsSync)
  found.set(fileName, file)
  return file
}
