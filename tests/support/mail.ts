import { inject } from 'vitest'
import { simpleParser, type ParsedMail } from 'mailparser'
import type { StoredMail } from '../../scripts/fakes/mail'

/** Waits until the e-mail fake holds `count` messages to `to` whose subject matches, and returns it. */
export async function waitForMail(to: string, subject: RegExp, opts: { count?: number, timeoutMs?: number } = {}): Promise<StoredMail> {
  const { count = 1, timeoutMs = 10_000 } = opts
  const until = Date.now() + timeoutMs
  for (;;) {
    const res = await fetch(`${inject('mailUrl')}/messages?to=${encodeURIComponent(to)}`)
    const list = await res.json() as StoredMail[]
    const hits = list.filter(m => subject.test(m.subject))
    if (hits.length >= count) return hits[count - 1]!
    if (Date.now() > until) throw new Error(`no e-mail to ${to} matching ${subject} within ${timeoutMs} ms`)
    await new Promise(r => setTimeout(r, 150))
  }
}

export function linkToken(mail: StoredMail, path: string): string {
  const m = mail.text.match(new RegExp(`${path.replace('/', '\\/')}\\?token=([\\w-]{43})`))
  if (!m?.[1]) throw new Error(`no ${path} link in the e-mail`)
  return m[1]
}

/** Switches the e-mail fake's fault: 'reject' refuses every message (451), 'timeout' never greets. */
export async function setMailFault(mode: null | 'reject' | 'timeout'): Promise<void> {
  const res = await fetch(`${inject('mailUrl')}/__fake/fault`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ mode }) })
  if (res.status !== 200) throw new Error(`the mail fake refused the fault switch: ${res.status}`)
}

/** The whole `path?token=…` link in the e-mail, as its reader would open it. */
export function linkUrl(mail: StoredMail, path: string): string {
  const m = mail.text.match(new RegExp(`https?://[^\\s/]+${path.replace('/', '\\/')}\\?token=[\\w-]{43}`))
  if (!m) throw new Error(`no ${path} link in the e-mail`)
  return m[0]
}

/** The caught message's source (RFC 5322), exactly as the app sent it. */
export async function rawMail(mail: StoredMail): Promise<string> {
  const res = await fetch(`${inject('mailUrl')}/messages/${mail.id}/raw`)
  if (res.status !== 200) throw new Error(`the mail fake has no source for message ${mail.id}: ${res.status}`)
  return res.text()
}

/**
 * The caught message parsed from its source, every part as sent: `html` keeps its `cid:` links
 * (the parser would otherwise turn them into data: URLs), and `attachments` holds the inline
 * images with their content ids beside the files.
 */
export async function parseMail(mail: StoredMail): Promise<ParsedMail> {
  return simpleParser(await rawMail(mail), { keepCidLinks: true })
}
