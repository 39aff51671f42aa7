import { defineProvider } from '@nuxt/image/runtime'

/**
 * @nuxt/image provider for the venue's uploaded images: the server's /media route resizes and
 * re-encodes on request, so a phone gets a small WebP and a card a larger one, from the one stored
 * file. Widths go up to the next width the server makes (`widths`, IMAGE_WIDTHS of shared/content.ts,
 * passed in nuxt.config.ts) and the quality is the server's own for the format, so every address a
 * page writes is one the server has cached.
 */
export default defineProvider<{ widths?: readonly number[] }>({
  getImage(src, { modifiers, widths = [] }) {
    const q = new URLSearchParams()
    if (modifiers.width) {
      const want = Number(modifiers.width)
      q.set('w', String(widths.find(w => w >= want) ?? widths.at(-1) ?? want))
    }
    if (modifiers.format) q.set('f', String(modifiers.format))
    const name = src.replace(/^\/+/, '')
    return { url: `/media/${encodeURIComponent(name)}${q.size ? `?${q}` : ''}` }
  },
})
