import type { Db } from './db'
import type { Transporter } from 'nodemailer'
import type SMTPTransport from 'nodemailer/lib/smtp-transport'
import { escapeHtml } from './escape-html'

export interface OutgoingMail { to: string, subject: string, paragraphs: string[], link?: { href: string, label: string } }

/**
 * Queues a message in the outbox inside the caller's transaction: the change and
 * its mail commit together, and sending happens later (server/plugins/mail-worker.ts).
 * Values are escaped here, never interpolated into markup by callers.
 */
export async function enqueueMail(db: Db, mail: OutgoingMail): Promise<void> {
  const text = [...mail.paragraphs, ...(mail.link ? [`${mail.link.label}: ${mail.link.href}`] : []), '', '— The Pullsheet desk'].join('\n\n')
  const html = [
    ...mail.paragraphs.map(p => `<p>${escapeHtml(p)}</p>`),
    mail.link ? `<p><a href="${escapeHtml(mail.link.href)}">${escapeHtml(mail.link.label)}</a></p>` : '',
    '<p>— The Pullsheet desk</p>',
  ].join('\n')
  await db('mail_outbox').insert({ to_address: mail.to, subject: mail.subject.slice(0, 300), body_text: text, body_html: html })
}

let transporter: Promise<Transporter<SMTPTransport.SentMessageInfo>> | undefined

/**
 * nodemailer (about 3 MB of heap, 16 MB resident) loads with the first message or health
 * check, not at startup: a serving process that sends no mail does not hold it.
 */
function useTransport(): Promise<Transporter> {
  const url = appConfig().smtpUrl
  // The URL decides host, port, credentials and TLS; STARTTLS is used when the server offers it.
  const options: SMTPTransport.Options = { url, connectionTimeout: 5000, greetingTimeout: 5000, socketTimeout: 10000 }
  if (!transporter) {
    transporter = import('nodemailer').then(({ default: nodemailer }) => nodemailer.createTransport(options))
    // A failed load is not kept: the next message or check loads again.
    transporter.catch(() => { transporter = undefined })
  }
  return transporter
}

/** Backoff between tries: base (30 s), then doubling, capped at an hour; gives up after 12 tries. */
export function retryDelaySeconds(attempts: number, baseSeconds = Number(process.env.MAIL_RETRY_BASE_SECONDS ?? 30)): number {
  return Math.min(3600, baseSeconds * 2 ** Math.max(0, attempts - 1))
}
const MAX_ATTEMPTS = 12

/**
 * Sends due messages. Rows are claimed with FOR UPDATE SKIP LOCKED and leased
 * by moving next_attempt_at forward, so two app servers never send one twice.
 */
export async function deliverDueMail(limit = 20): Promise<number> {
  const db = useDb()
  const claimed = await db.transaction(async (trx) => {
    const rows = await trx('mail_outbox')
      .where('status', 'pending')
      .where('next_attempt_at', '<=', trx.raw('NOW(3)'))
      .orderBy('id')
      .limit(limit)
      .forUpdate()
      .skipLocked()
    if (rows.length) {
      await trx('mail_outbox').whereIn('id', rows.map(r => r.id)).update({
        attempts: trx.raw('attempts + 1'),
        next_attempt_at: trx.raw('NOW(3) + INTERVAL 5 MINUTE'),
      })
    }
    return rows
  })
  let sent = 0
  for (const row of claimed) {
    try {
      await (await useTransport()).sendMail({ from: appConfig().mailFrom, to: row.to_address, subject: row.subject, text: row.body_text, html: row.body_html ?? undefined })
      await db('mail_outbox').where({ id: row.id }).update({ status: 'sent', sent_at: db.raw('NOW(3)'), last_error: null })
      sent++
    }
    catch (error) {
      const attempts = Number(row.attempts) + 1
      await db('mail_outbox').where({ id: row.id }).update({
        status: attempts >= MAX_ATTEMPTS ? 'failed' : 'pending',
        last_error: String((error as Error).message ?? error).slice(0, 500),
        next_attempt_at: db.raw('NOW(3) + INTERVAL ? SECOND', [retryDelaySeconds(attempts)]),
      })
    }
  }
  return sent
}

/** For health: can we open an SMTP connection? */
export async function mailReachable(): Promise<boolean> {
  try { return await (await useTransport()).verify() }
  catch { return false }
}
