/**
 * Reads a QR code from pixels in the browser with jsQR (pure JavaScript: no worker, nothing that
 * the page's content security policy refuses). The library is loaded on first use only, so it
 * weighs on the host's page when the host scans, never on any other page.
 */
type Decode = typeof import('jsqr').default

let decoder: Promise<Decode> | undefined
const loadDecoder = () => (decoder ??= import('jsqr').then(m => m.default))

/** Frames and photos are read at most this wide or high: a QR code on a phone is large in the frame. */
const MAX_SIDE = 800

/**
 * The text of the QR code in `source` (a video frame, an image, a bitmap), or null when none is
 * found. Both the camera and "read a photo" come through here.
 */
export async function readQrCode(source: CanvasImageSource, width: number, height: number, canvas: HTMLCanvasElement = document.createElement('canvas')): Promise<string | null> {
  const decode = await loadDecoder()
  if (!width || !height) return null
  const scale = Math.min(1, MAX_SIDE / Math.max(width, height))
  const w = Math.max(1, Math.round(width * scale))
  const h = Math.max(1, Math.round(height * scale))
  canvas.width = w
  canvas.height = h
  const ctx = canvas.getContext('2d', { willReadFrequently: true })
  if (!ctx) return null
  ctx.drawImage(source, 0, 0, w, h)
  const found = decode(ctx.getImageData(0, 0, w, h).data, w, h, { inversionAttempts: 'attemptBoth' })
  return found?.data || null
}

/** The text of the QR code in a photo file (PNG, JPEG…), or null when none is found. */
export async function readQrPhoto(file: Blob): Promise<string | null> {
  const bitmap = await createImageBitmap(file)
  try {
    return await readQrCode(bitmap, bitmap.width, bitmap.height)
  }
  finally {
    bitmap.close()
  }
}
