import { defineProvider } from '@nuxt/image/runtime'
import { snapImageWidth } from '../shared/content'

/**
 * @nuxt/image provider for the venue's uploaded images: the server's /media route resizes and
 * re-encodes on request, so a phone gets a small WebP and a card a larger one, from the one stored
 * file. Widths go up to the next width the server makes (IMAGE_WIDTHS) and the quality is the
 * server's own for the format, so every address a page writes is one the server has cached.
 */
export default defineProvider({
  getImage(src, { modifiers }) {
    const q = new URLSearchParams()
    if (modifiers.width) q.set('w', String(snapImageWidth(Number(modifiers.width))))
    if (modifiers.format) q.set('f', String(modifiers.format))
    const name = src.replace(/^\/+/, '')
    return { url: `/media/${encodeURIComponent(name)}${q.size ? `?${q}` : ''}` }
  },
})
