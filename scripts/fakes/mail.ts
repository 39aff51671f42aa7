/**
 * The local e-mail fake: an SMTP sink (smtp-server) on 127.0.0.1 that keeps every message the app
 * sends, plus a small HTTP page and JSON API to read them. Development and tests only; production
 * sends through the SMTP server named in the environment.
 */
import { SMTPServer } from 'smtp-server'
import { simpleParser } from 'mailparser'
import { createServer, type Server } from 'node:http'
import { mkdirSync, writeFileSync } from 'node:fs'
import { resolve } from 'node:path'

export interface StoredMail {
  id: number
  receivedAt: string
  from: string
  replyTo: string
  to: string[]
  subject: string
  text: string
  html: string | null
  attachments: { filename: string, contentType: string, size: number }[]
}

/** 'reject': every message is refused with a temporary error; 'timeout': the greeting never comes. */
export type MailFault = null | 'reject' | 'timeout'
/** How long a held connection waits (the app's own greeting timeout is 5 s) before it is dropped. */
const FAULT_HOLD_MS = 15_000

export interface MailFake { close: () => Promise<void>, messages: StoredMail[], setFault: (mode: MailFault) => void }

const escapeHtml = (s: string) => s.replace(/[&<>"']/g, c => `&#${c.charCodeAt(0)};`)

function page(messages: StoredMail[]): string {
  const rows = [...messages].reverse().map(m => `
    <article>
      <header><strong>${escapeHtml(m.subject)}</strong><span>#${m.id} · ${escapeHtml(m.receivedAt)}</span></header>
      <p class="meta">to ${escapeHtml(m.to.join(', '))} · from ${escapeHtml(m.from)}${m.replyTo ? ` · reply to ${escapeHtml(m.replyTo)}` : ''}${m.attachments.length ? ` · attachments: ${m.attachments.map(a => escapeHtml(a.filename)).join(', ')}` : ''}${m.html === null ? '' : ` · <a href="/messages/${m.id}/html">as HTML</a>`} · <a href="/messages/${m.id}/raw">source</a></p>
      <pre>${escapeHtml(m.text)}</pre>
    </article>`).join('')
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Larmoir outgoing mail (local)</title>
  <style>body{font:15px/1.5 system-ui,sans-serif;max-width:60rem;margin:2rem auto;padding:0 1rem;background:#faf7f1;color:#1e2326}
  article{background:#fff;border:1px solid #e3ddd2;border-radius:8px;padding:1rem;margin:1rem 0}
  header{display:flex;justify-content:space-between;gap:1rem}header span,.meta{color:#7b868c;font-size:13px}
  pre{white-space:pre-wrap;font:14px/1.5 ui-monospace,monospace}</style></head>
  <body><h1>Outgoing mail, caught locally</h1><p>${messages.length} message(s). Nothing here left this machine.</p>${rows}</body></html>`
}

export async function startMailFake(opts: { smtpPort: number, httpPort: number, dir: string }): Promise<MailFake> {
  mkdirSync(opts.dir, { recursive: true })
  const messages: StoredMail[] = []
  /** Each message as it arrived (RFC 5322 source), so a test can parse every part itself. */
  const raws = new Map<number, Buffer>()
  let nextId = 1
  let fault: MailFault = null
  const held = new Set<NodeJS.Timeout>()

  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onConnect(_session, callback) {
      if (fault !== 'timeout') return callback()
      const timer = setTimeout(() => { held.delete(timer); callback(new Error('Simulated timeout of the local mail fake')) }, FAULT_HOLD_MS)
      held.add(timer)
    },
    onMailFrom(_address, _session, callback) {
      if (fault === 'reject') {
        const err = new Error('Simulated outage of the local mail fake (fault mode "reject")') as Error & { responseCode: number }
        err.responseCode = 451 // RFC 5321 §4.2.3: local error in processing, try again later
        return callback(err)
      }
      callback()
    },
    onData(stream, session, callback) {
      const chunks: Buffer[] = []
      stream.on('data', (c: Buffer) => chunks.push(c))
      stream.on('end', async () => {
        const raw = Buffer.concat(chunks)
        const parsed = await simpleParser(raw)
        const id = nextId++
        writeFileSync(resolve(opts.dir, `${String(id).padStart(5, '0')}.eml`), raw)
        raws.set(id, raw)
        messages.push({
          id,
          receivedAt: new Date().toISOString(),
          from: parsed.from?.text ?? '',
          replyTo: parsed.replyTo?.text ?? '',
          to: session.envelope.rcptTo.map(r => r.address),
          subject: parsed.subject ?? '',
          text: parsed.text ?? '',
          html: typeof parsed.html === 'string' ? parsed.html : null,
          attachments: parsed.attachments.map(a => ({ filename: a.filename ?? '', contentType: a.contentType, size: a.size })),
        })
        callback()
      })
    },
  })

  const http: Server = createServer((req, res) => {
    const url = new URL(req.url ?? '/', 'http://127.0.0.1')
    const one = /^\/messages\/(\d+)\/(raw|html)$/.exec(url.pathname)
    if (one && req.method === 'GET') {
      const id = Number(one[1])
      const raw = raws.get(id)
      const html = messages.find(m => m.id === id)?.html
      if (!raw) res.writeHead(404).end()
      else if (one[2] === 'raw') res.writeHead(200, { 'content-type': 'message/rfc822' }).end(raw)
      // The HTML part as a mail program shows it: the parser has turned its cid: images into data: URLs.
      else if (html) res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' }).end(html)
      else res.writeHead(404).end()
    }
    else if (url.pathname === '/messages' && req.method === 'GET') {
      const to = url.searchParams.get('to')
      const list = to ? messages.filter(m => m.to.includes(to)) : messages
      res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify(list))
    }
    else if (url.pathname === '/messages' && req.method === 'DELETE') {
      messages.length = 0
      raws.clear()
      res.writeHead(204).end()
    }
    else if (url.pathname === '/__fake/fault' && req.method === 'POST') {
      let raw = ''
      req.on('data', (c: Buffer) => { raw += c.toString('utf8') })
      req.on('end', () => {
        let mode: unknown
        try { mode = (JSON.parse(raw || '{}') as { mode?: unknown }).mode ?? null }
        catch { mode = 'bad' }
        if (mode !== null && mode !== 'reject' && mode !== 'timeout') {
          res.writeHead(400, { 'content-type': 'application/json' }).end(JSON.stringify({ message: 'mode must be "reject", "timeout" or null' }))
          return
        }
        fault = mode
        res.writeHead(200, { 'content-type': 'application/json' }).end(JSON.stringify({ mode: fault }))
      })
    }
    else if (url.pathname === '/') {
      res.writeHead(200, { 'content-type': 'text/html; charset=utf-8' }).end(page(messages))
    }
    else {
      res.writeHead(404).end()
    }
  })

  await new Promise<void>((ok, fail) => { smtp.once('error', fail); smtp.listen(opts.smtpPort, '127.0.0.1', () => ok()) })
  await new Promise<void>((ok, fail) => { http.once('error', fail); http.listen(opts.httpPort, '127.0.0.1', () => ok()) })

  return {
    messages,
    setFault: (mode) => { fault = mode },
    close: async () => {
      for (const t of held) clearTimeout(t)
      held.clear()
      await new Promise<void>(ok => smtp.close(() => ok()))
      await new Promise<void>(ok => http.close(() => ok()))
    },
  }
}
