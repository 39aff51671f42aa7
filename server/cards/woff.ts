/**
 * WOFF 1.0 to plain OpenType (sfnt), with Node's own zlib: pdfkit's font library would otherwise
 * inflate each table in JavaScript for every document (most of a card's time). The layout follows
 * the W3C WOFF File Format 1.0 Recommendation (2012): a 44-byte header, 20-byte table entries
 * (tag, offset, compressed length, original length, checksum), each table zlib-compressed when
 * that made it smaller; sfnt tables are 4-byte aligned after a 12-byte offset table and 16-byte
 * records (OpenType specification, "Organization of an OpenType Font").
 */
import { inflateSync } from 'node:zlib'

const cache = new WeakMap<Buffer, Buffer>()

/** The sfnt a WOFF file wraps; anything that is not WOFF comes back as it is. Memoised per buffer. */
export function sfntOf(font: Buffer): Buffer {
  const known = cache.get(font)
  if (known) return known
  const out = font.toString('latin1', 0, 4) === 'wOFF' ? unwrap(font) : font
  cache.set(font, out)
  return out
}

function unwrap(woff: Buffer): Buffer {
  const flavor = woff.readUInt32BE(4)
  const numTables = woff.readUInt16BE(12)
  const tables = Array.from({ length: numTables }, (_, i) => {
    const at = 44 + 20 * i
    const offset = woff.readUInt32BE(at + 4)
    const compLength = woff.readUInt32BE(at + 8)
    const origLength = woff.readUInt32BE(at + 12)
    const raw = woff.subarray(offset, offset + compLength)
    const data = compLength < origLength ? inflateSync(raw) : raw
    if (data.length !== origLength) throw new Error('a WOFF table does not inflate to its stated length')
    return { tag: woff.subarray(at, at + 4), checksum: woff.readUInt32BE(at + 16), data }
  })
  // searchRange etc.: the largest power of two ≤ numTables, × 16 (OpenType offset table).
  const entrySelector = Math.floor(Math.log2(numTables))
  const searchRange = 2 ** entrySelector * 16
  const headerSize = 12 + 16 * numTables
  const size = headerSize + tables.reduce((n, t) => n + ((t.data.length + 3) & ~3), 0)
  const sfnt = Buffer.alloc(size)
  sfnt.writeUInt32BE(flavor, 0)
  sfnt.writeUInt16BE(numTables, 4)
  sfnt.writeUInt16BE(searchRange, 6)
  sfnt.writeUInt16BE(entrySelector, 8)
  sfnt.writeUInt16BE(numTables * 16 - searchRange, 10)
  let offset = headerSize
  tables.forEach((t, i) => {
    const rec = 12 + 16 * i
    t.tag.copy(sfnt, rec)
    sfnt.writeUInt32BE(t.checksum, rec + 4)
    sfnt.writeUInt32BE(offset, rec + 8)
    sfnt.writeUInt32BE(t.data.length, rec + 12)
    t.data.copy(sfnt, offset)
    offset += (t.data.length + 3) & ~3
  })
  return sfnt
}
