// Local SMTP catcher: accepts every message and stores it under MAIL_DIR as
// <time>-<id>.eml plus a .json summary (envelope, subject, text) for tests and the dev page.
import { randomBytes } from 'node:crypto'
import { mkdirSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { simpleParser } from 'mailparser'
import { SMTPServer } from 'smtp-server'

const port = Number(process.env.SMTP_PORT)
const mailDir = process.env.MAIL_DIR!
mkdirSync(mailDir, { recursive: true })

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ['STARTTLS'],
  logger: false,
  size: 25 * 1024 * 1024,
  onData(stream, session, callback) {
    const chunks: Buffer[] = []
    stream.on('data', (c: Buffer) => chunks.push(c))
    stream.on('end', async () => {
      try {
        const raw = Buffer.concat(chunks)
        const parsed = await simpleParser(raw)
        const id = `${new Date().toISOString().replace(/[:.]/g, '-')}-${randomBytes(4).toString('hex')}`
        writeFileSync(join(mailDir, `${id}.eml`), raw)
        writeFileSync(join(mailDir, `${id}.json`), JSON.stringify({
          id,
          receivedAt: new Date().toISOString(),
          from: session.envelope.mailFrom ? session.envelope.mailFrom.address : null,
          to: session.envelope.rcptTo.map(r => r.address),
          subject: parsed.subject ?? '',
          text: parsed.text ?? '',
          html: typeof parsed.html === 'string' ? parsed.html : '',
        }, null, 2))
        callback()
      }
      catch (error) { callback(error as Error) }
    })
  },
})
server.listen(port, '127.0.0.1', () => console.log(`mail: SMTP catcher on 127.0.0.1:${port}, messages in ${mailDir}`))
const stop = () => server.close(() => process.exit(0))
process.on('SIGTERM', stop)
process.on('SIGINT', stop)
