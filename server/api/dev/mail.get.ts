import { readdir, readFile } from 'node:fs/promises'
import { join } from 'node:path'

/** The local catcher's messages, for admins of a demo or development install only. */
export default defineEventHandler(async (event) => {
  await requireRole(event, 'admin')
  const dir = appConfig().mailCatcherDir
  if (!appConfig().demo || !dir) notFound()
  const files = (await readdir(dir).catch(() => [])).filter(f => f.endsWith('.json')).sort().reverse().slice(0, 200)
  const messages = await Promise.all(files.map(async f => JSON.parse(await readFile(join(dir, f), 'utf8'))))
  return { messages: messages.map(m => ({ id: m.id, receivedAt: m.receivedAt, to: m.to, subject: m.subject, text: m.text })) }
})
