/**
 * Whole card PDFs kept by their content key: a SHA-256 of everything a PDF is made from — the cards
 * themselves (the venue's name, address, units and cautions; the flight, its version, its pours
 * with their figures and photos' absence or presence; the published notes and introduction; the
 * room's air, the venue's usual or the host's reading; the guest's name and the session), the paper
 * and the title. A note, a venue setting, a revision or a reading that changes changes the key,
 * so a kept PDF is never out of date: it is only dropped, least recently used first, past the
 * bound. Pure (no server imports), like the renderer it wraps.
 */
import { createHash } from 'node:crypto'
import type { CardPaper } from '../../shared/paper'
import type { FlightCard } from '../../shared/types/cards'
import { renderCardsPdf, type CardFonts } from './cardPdf'

/** Memory the kept PDFs may take (a 40-guest session is about 0.5 MB; common practice, no source). */
const MAX_BYTES = 32 * 1024 * 1024

const kept = new Map<string, Buffer>()
let keptBytes = 0
const making = new Map<string, Promise<Buffer>>()

export interface CardsPdfOptions { paper: CardPaper, fonts: CardFonts, title?: string, onCard?: (done: number, total: number) => void }

function cardsPdfKey(cards: FlightCard[], opts: Pick<CardsPdfOptions, 'paper' | 'title'>): string {
  return createHash('sha256').update(JSON.stringify([opts.paper, opts.title ?? null, cards])).digest('base64url')
}

/** The PDF of these cards: the kept one for the same content, else made (once, for requests at the same moment) and kept. */
export async function cachedCardsPdf(cards: FlightCard[], opts: CardsPdfOptions): Promise<Buffer> {
  const key = cardsPdfKey(cards, opts)
  const known = kept.get(key)
  if (known) {
    kept.delete(key)
    kept.set(key, known)
    opts.onCard?.(cards.length, cards.length)
    return known
  }
  let pending = making.get(key)
  if (!pending) {
    pending = renderCardsPdf(cards, opts).finally(() => making.delete(key))
    making.set(key, pending)
  }
  const pdf = await pending
  opts.onCard?.(cards.length, cards.length)
  if (!kept.has(key) && pdf.length <= MAX_BYTES) {
    kept.set(key, pdf)
    keptBytes += pdf.length
    for (const [k, v] of kept) {
      if (keptBytes <= MAX_BYTES) break
      kept.delete(k)
      keptBytes -= v.length
    }
  }
  return pdf
}
