import { existsSync, readdirSync, readFileSync } from 'node:fs'
import { join } from 'node:path'

export interface CaughtMail { id: string, to: string[], subject: string, text: string, html: string }

export function caughtMail(): CaughtMail[] {
  const dir = process.env.MAIL_CATCHER_DIR!
  if (!existsSync(dir)) return []
  // A message being written by the catcher at this moment is read on the next look.
  return readdirSync(dir).filter(f => f.endsWith('.json')).sort().flatMap((f) => {
    try { return [JSON.parse(readFileSync(join(dir, f), 'utf8')) as CaughtMail] }
    catch { return [] }
  })
}

/** Waits until a message to `to` matching `subject` arrives in the catcher. */
export async function waitForMail(to: string, subject: RegExp, timeoutMs = 15_000): Promise<CaughtMail> {
  const until = Date.now() + timeoutMs
  while (Date.now() < until) {
    const found = caughtMail().find(m => m.to.includes(to) && subject.test(m.subject))
    if (found) return found
    await new Promise(r => setTimeout(r, 200))
  }
  throw new Error(`no mail to ${to} matching ${subject} within ${timeoutMs} ms`)
}
