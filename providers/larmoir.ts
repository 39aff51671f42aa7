import { defineProvider } from '@nuxt/image/runtime'

/**
 * @nuxt/image provider for the venue's uploaded images: the server's /media route resizes and
 * re-encodes on request (width, format, quality), so a phone gets a small WebP and a card a
 * larger one, from the one stored file.
 */
export default defineProvider({
  getImage(src, { modifiers }) {
    const q = new URLSearchParams()
    if (modifiers.width) q.set('w', String(modifiers.width))
    if (modifiers.format) q.set('f', String(modifiers.format))
    if (modifiers.quality) q.set('q', String(modifiers.quality))
    const name = src.replace(/^\/+/, '')
    return { url: `/media/${encodeURIComponent(name)}${q.size ? `?${q}` : ''}` }
  },
})
