import type { H3Event } from 'h3'

/**
 * How many proxies of our own stand in front of the server (NUXT_TRUSTED_PROXY_HOPS, default 0).
 * Each appends the address it received the request from to X-Forwarded-For, so the client's own
 * address is that many entries from the right; everything to its left was written by the client and
 * proves nothing. 0 means the header is not read at all (the socket's address is the client's).
 */
function trustedProxyHops(): number {
  const hops = Number(useRuntimeConfig().trustedProxyHops)
  return Number.isInteger(hops) && hops > 0 ? hops : 0
}

/** The client's address as far as our own proxies vouch for it; see trustedProxyHops. */
export function clientAddress(event: H3Event): string {
  const socket = event.node.req.socket?.remoteAddress ?? 'unknown'
  const hops = trustedProxyHops()
  if (!hops) return socket
  const header = getRequestHeader(event, 'x-forwarded-for')
  if (!header) return socket
  const entries = header.split(',').map(s => s.trim()).filter(Boolean)
  if (!entries.length) return socket
  return entries[Math.max(0, entries.length - hops)]!
}

/** Whether the request reached us over HTTPS: the socket itself, or our nearest trusted proxy says so. */
export function servedOverHttps(event: H3Event): boolean {
  if ((event.node.req.socket as { encrypted?: boolean } | undefined)?.encrypted) return true
  if (!trustedProxyHops()) return false
  const proto = getRequestHeader(event, 'x-forwarded-proto')?.split(',').pop()?.trim().toLowerCase()
  return proto === 'https'
}
