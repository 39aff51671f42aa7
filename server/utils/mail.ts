import nodemailer, { type Transporter } from 'nodemailer'
import { and, eq, lte, asc } from 'drizzle-orm'
import type { OutboxAttachment } from '../db/schema/mail'

/** An e-mail as the app writes it: a plain-text and an HTML version of the same message (multipart/alternative). */
export interface MailMessage {
  to: string
  subject: string
  text: string
  html: string
  /** Files, and the images the HTML shows inline (those with a `cid`). */
  attachments?: OutboxAttachment[]
}

/** Attempts before a message is marked failed; retries back off 30 s, 1 min, 2 min, … */
const MAX_ATTEMPTS = 10
const BASE_BACKOFF_MS = 30_000

let transport: Transporter | undefined
function useTransport(): Transporter {
  if (!transport) {
    const { smtp } = useRuntimeConfig()
    transport = nodemailer.createTransport({
      host: smtp.host,
      port: Number(smtp.port),
      secure: Boolean(smtp.secure),
      ignoreTLS: !smtp.secure && !smtp.user,
      auth: smtp.user ? { user: smtp.user, pass: smtp.pass } : undefined,
      connectionTimeout: 5000,
      greetingTimeout: 5000,
      socketTimeout: 10_000,
    })
  }
  return transport
}

/** Writes the message to the outbox inside the caller's transaction; nothing is sent yet. */
export async function queueMail(tx: Tx, message: MailMessage): Promise<void> {
  await tx.insert(tables.outbox).values({
    toAddress: message.to,
    subject: message.subject,
    textBody: message.text,
    htmlBody: message.html,
    attachments: message.attachments ?? null,
    nextAttemptAt: new Date(),
  })
}

let flushing: Promise<number> | null = null

/** Sends every due message once; safe to call often (one flush at a time per process). */
function flushOutbox(): Promise<number> {
  flushing ??= sendDue().finally(() => { flushing = null })
  return flushing
}

/** Fire-and-forget flush after a transaction that queued mail has committed. */
export function kickOutbox(): void {
  flushOutbox().catch(err => console.error('[mail] flush failed:', (err as Error).message))
}

/** The address part of a configured sender, "Larmoir <no-reply@larmoir.test>" → "no-reply@larmoir.test". */
function senderAddress(from: string): string {
  return /<([^<>]+)>\s*$/.exec(from)?.[1]?.trim() ?? from.trim()
}

async function sendDue(): Promise<number> {
  const db = useDb()
  const { smtp } = useRuntimeConfig()
  const due = await db.select().from(tables.outbox)
    .where(and(eq(tables.outbox.status, 'pending'), lte(tables.outbox.nextAttemptAt, new Date())))
    .orderBy(asc(tables.outbox.id)).limit(50)
  if (!due.length) return 0
  // Mail goes out in the venue's name from the configured sender address (which the mail server
  // allows to send); replies go to the venue's own address when it has one.
  const venue = await getVenue()
  const from = { name: venue.name, address: senderAddress(smtp.from) }
  const replyTo = venue.email ? { name: venue.name, address: venue.email } : undefined
  let sent = 0
  for (const m of due) {
    try {
      await useTransport().sendMail({
        from,
        replyTo,
        to: m.toAddress,
        subject: m.subject,
        text: m.textBody,
        html: m.htmlBody ?? undefined,
        attachments: (m.attachments ?? []).map(a => ({
          filename: a.filename, contentType: a.contentType, content: Buffer.from(a.contentBase64, 'base64'),
          ...(a.cid ? { cid: a.cid, contentDisposition: 'inline' as const } : {}),
        })),
      })
      await db.update(tables.outbox).set({ status: 'sent', sentAt: new Date(), attempts: m.attempts + 1, lastError: null }).where(eq(tables.outbox.id, m.id))
      sent++
    }
    catch (err) {
      const attempts = m.attempts + 1
      await db.update(tables.outbox).set({
        attempts,
        status: attempts >= MAX_ATTEMPTS ? 'failed' : 'pending',
        lastError: String((err as Error).message).slice(0, 1000),
        nextAttemptAt: new Date(Date.now() + BASE_BACKOFF_MS * 2 ** (attempts - 1)),
      }).where(eq(tables.outbox.id, m.id))
    }
  }
  return sent
}
