import type { H3Event } from 'h3'
import { IMAGE_MAX_BYTES } from '../../shared/content'
import { LAB_SHEET_MAX_BYTES } from '../../shared/labSheet'

/** Largest JSON body an ordinary route reads: the longest text any form sends is 50,000 characters. */
const JSON_BODY_MAX_BYTES = 512 * 1024

/** Where h3's readRawBody looks for a body someone already read (h3 1.x, `Symbol.for('h3RawBody')`). */
const RAW_BODY = Symbol.for('h3RawBody')
const PAYLOAD_METHODS = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])

/**
 * The most a request body may hold on this path: lab sheets travel as JSON text (escaped, so up to
 * twice the sheet's own limit), images as multipart (the image's limit plus the form's framing).
 */
export function bodyLimitFor(path: string): number {
  if (/^\/api\/lab-sheets(?:[/?]|$)/.test(path)) return 2 * LAB_SHEET_MAX_BYTES
  if (path.startsWith('/api/images')) return IMAGE_MAX_BYTES + 1024 * 1024
  return JSON_BODY_MAX_BYTES
}

export function bodyTooLarge(event: H3Event): never {
  if (event.path.startsWith('/api/images')) {
    tooLarge(`Images may be at most ${IMAGE_MAX_BYTES / 1024 / 1024} MB.`, { file: `At most ${IMAGE_MAX_BYTES / 1024 / 1024} MB.` })
  }
  const kb = Math.round(bodyLimitFor(event.path) / 1024)
  tooLarge(`The request is too large: this form sends at most ${kb >= 1024 ? `${kb / 1024} MB` : `${kb} KB`}.`)
}

/**
 * After a refusal, what the client still sends is thrown away as it arrives (never kept), so that a
 * browser finishing an oversize upload reads the 413 instead of a broken connection; past this many
 * bytes the connection is cut (common practice, no source).
 */
const DISCARD_MAX_BYTES = 16 * 1024 * 1024

function discardThenCut(req: H3Event['node']['req']): void {
  let discarded = 0
  req.removeAllListeners('data')
  req.on('data', (chunk: Buffer) => {
    discarded += chunk.length
    if (discarded > DISCARD_MAX_BYTES) req.socket.destroy()
  })
  req.resume()
}

/**
 * Reads the request body, counting bytes as they arrive, and stops at the path's limit: a declared
 * Content-Length over it is refused before a byte is read, and a body with no length (chunked) is
 * refused as soon as it passes the limit. Nothing past the limit is kept in memory: the rest is
 * thrown away as it arrives, and the connection cut after DISCARD_MAX_BYTES more.
 * What was read is left where h3's readRawBody finds it, so routes read their body as usual.
 */
export async function readBodyWithinLimit(event: H3Event): Promise<void> {
  if (!PAYLOAD_METHODS.has(event.method)) return
  const req = event.node.req as typeof event.node.req & { [RAW_BODY]?: Promise<Buffer> }
  const limit = bodyLimitFor(event.path)
  const refuse = (): never => {
    discardThenCut(req)
    bodyTooLarge(event)
  }
  const declared = Number(req.headers['content-length'] ?? 0)
  if (declared > limit) return refuse()
  const chunked = /\bchunked\b/i.test(String(req.headers['transfer-encoding'] ?? ''))
  if (!declared && !chunked) return
  const body = await new Promise<Buffer | null>((done, fail) => {
    const parts: Buffer[] = []
    let bytes = 0
    const onData = (chunk: Buffer) => {
      bytes += chunk.length
      if (bytes > limit) {
        stop()
        done(null)
        return
      }
      parts.push(chunk)
    }
    const onEnd = () => {
      stop()
      done(Buffer.concat(parts))
    }
    const onError = (err: Error) => {
      stop()
      fail(err)
    }
    const stop = () => {
      req.off('data', onData).off('end', onEnd).off('error', onError)
    }
    req.on('data', onData).on('end', onEnd).on('error', onError)
  })
  if (!body) return refuse()
  req[RAW_BODY] = Promise.resolve(body)
}

/** Deepest nesting of arrays and objects a JSON body may have; no form of ours goes past 6. */
export const JSON_MAX_DEPTH = 64

/**
 * How deeply `text` nests arrays and objects, counted in one pass without recursion (brackets inside
 * strings do not count), stopping as soon as `stopAt` is passed.
 */
export function jsonDepth(text: string, stopAt = Infinity): number {
  let depth = 0
  let deepest = 0
  let inString = false
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i)
    if (inString) {
      if (c === 92) i++ // backslash: the next character is escaped
      else if (c === 34) inString = false
      continue
    }
    if (c === 34) inString = true
    else if (c === 123 || c === 91) {
      depth++
      if (depth > deepest) {
        deepest = depth
        if (deepest > stopAt) return deepest
      }
    }
    else if (c === 125 || c === 93) depth--
  }
  return deepest
}
