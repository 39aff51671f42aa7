import type { H3Event } from 'h3'
import { IMAGE_MAX_BYTES } from '../../shared/content'
import { LAB_SHEET_MAX_BYTES } from '../../shared/labSheet'

/** Largest JSON body an ordinary route reads: the longest text any form sends is 50,000 characters. */
const JSON_BODY_MAX_BYTES = 512 * 1024

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
