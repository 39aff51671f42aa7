import type { H3Event } from 'h3'

/**
 * Serves public pages from the page cache (server/utils/pageCache.ts) and stores them after a
 * render, through the renderer's own hooks: `render:before` answers a hit without rendering,
 * `render:response` keeps a fresh render. A successful write ends what the cache holds
 * (`beforeResponse`, after the route's transaction has committed).
 *
 * Cache-Control: a page from the cache says `no-cache` (RFC 9111 §5.2.2.4: a browser or a shared
 * cache may keep it but must ask again before each use; the ETag makes that a 304) and
 * `Vary: Cookie, Accept-Encoding` (it is sent gzipped, made once, to whoever accepts gzip); every
 * other page says `private, no-store` (RFC 9111 §5.2.2.5, §5.2.2.7), so no shared cache ever keeps
 * a page rendered for someone signed in. A page that sets its own
 * Cache-Control keeps it and is not cached.
 */
const FROM_CACHE = 'no-cache'
const NOT_FROM_CACHE = 'private, no-store'
/** A page differs by who is signed in, and a cached one comes gzipped to those who accept it. */
const VARY = 'Cookie, Accept-Encoding'
/** How long a request waits for another request's render of the same page before rendering itself. */
const WAIT_FOR_RENDER_MS = 5_000

interface PageCacheState { key: string, hit: boolean, generation: number }

/** Whether the browser takes the page gzipped (the cache keeps it so, made once). */
const acceptsGzip = (event: H3Event) => /\bgzip\b/.test(getRequestHeader(event, 'accept-encoding') ?? '')

const stateOf = (event: H3Event) => event.context.pageCache as PageCacheState | undefined

export default defineNitroPlugin((nitro) => {
  if (import.meta.dev) return

  nitro.hooks.hook('render:before', async (ctx) => {
    const event = ctx.event
    const key = pageCacheKey(event)
    if (!key) return
    let page = cachedPage(key)
    if (!page) {
      if (beginPageRender(key)) {
        // This request renders the page; the others wait for it. Ended however the request ends.
        event.node.res.once('close', () => endPageRender(key))
      }
      else {
        await waitForPageRender(key, WAIT_FOR_RENDER_MS)
        page = cachedPage(key)
      }
    }
    if (!page) {
      event.context.pageCache = { key, hit: false, generation: currentPageGeneration() } satisfies PageCacheState
      return
    }
    event.context.pageCache = { key, hit: true, generation: page.generation } satisfies PageCacheState
    const gzip = acceptsGzip(event)
    const etag = gzip ? page.gzippedEtag : page.etag
    const fresh = getRequestHeader(event, 'if-none-match') === etag
    ctx.response = {
      body: fresh ? '' : gzip ? page.gzipped : page.body,
      statusCode: fresh ? 304 : 200,
      headers: {
        'content-type': 'text/html;charset=utf-8',
        ...(gzip ? { 'content-encoding': 'gzip' } : {}),
        'content-security-policy': page.csp,
        'cache-control': FROM_CACHE,
        'vary': VARY,
        'etag': etag,
        'age': String(Math.floor((Date.now() - page.storedAt) / 1000)),
        'x-page-cache': 'hit',
      },
    }
  })

  nitro.hooks.hook('render:response', (response, { event }) => {
    const state = stateOf(event)
    if (state?.hit) return
    const res = event.node.res
    const ownCacheControl = res.hasHeader('cache-control')
    const csp = res.getHeader('content-security-policy')
    const stored = state && !ownCacheControl && (response.statusCode ?? 200) === 200 && typeof response.body === 'string'
      && !res.hasHeader('set-cookie') && typeof csp === 'string'
      ? storePage(state.key, response.body, csp, state.generation)
      : null
    response.headers ??= {}
    response.headers.vary = VARY
    if (stored) {
      // The first visitor gets the page gzipped too, as every later one does from the cache.
      const gzip = acceptsGzip(event)
      if (gzip) response.body = stored.gzipped as unknown as string
      Object.assign(response.headers, { 'cache-control': FROM_CACHE, 'etag': gzip ? stored.gzippedEtag : stored.etag, 'x-page-cache': 'miss', ...(gzip ? { 'content-encoding': 'gzip' } : {}) })
    }
    else if (!ownCacheControl) {
      response.headers['cache-control'] = NOT_FROM_CACHE
    }
  })

  nitro.hooks.hook('beforeResponse', (event, response) => {
    const error = response?.body instanceof Error ? (response.body as { statusCode?: number }).statusCode ?? 500 : null
    noteWrite(event.method, event.path, error ?? getResponseStatus(event))
  })
})
