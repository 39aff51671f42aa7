import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import pixelmatch from 'pixelmatch'
import { PNG } from 'pngjs'
import sharp from 'sharp'
import { describe, expect, it } from 'vitest'
import { glassDrawing, glassDrawingSvg } from '../../shared/glassDrawing'
import { DEFAULT_COLOUR_BY_KIND } from '../../shared/liquidColours'
import { drinkKindOf } from '../../shared/pours'
import { PRODUCT_KINDS, type ProductKind } from '../../shared/products'
import { computeFilm } from '../../shared/science'
import { DEFAULT_GLASSES } from '../../server/demo/data'

/**
 * Every product kind, in its usual colour and with a demo-like strength, sugar and serving
 * temperature, drawn in every demo glass and compared with the committed reference PNG. A missing
 * reference, or UPDATE_REFERENCE_IMAGES=1, writes the reference and fails, so that a new or
 * changed picture is looked at before it is committed (DEVELOPERS.md, "Reference images").
 * The drawings are the compact ones (no labels): librsvg's fonts differ from machine to machine;
 * the labels are checked in glassDrawing.test.ts.
 */
const DIR = join(import.meta.dirname, '__images__', 'glass')
const WIDTH_PX = 240
/** pixelmatch's per-pixel colour threshold (its default, 0.1) and the share of pixels allowed to differ. */
const THRESHOLD = 0.1
const MAX_DIFF_SHARE = 0.005
const UPDATE = process.env.UPDATE_REFERENCE_IMAGES === '1'

/** A typical pour of each kind (common practice, no source): ABV % vol, sugar g/L, serving °C. */
const TYPICAL: Record<ProductKind, { abv: number, sugar: number, temp: number }> = {
  still_wine: { abv: 12.5, sugar: 2, temp: 12 },
  sparkling: { abv: 11.8, sugar: 8, temp: 7 },
  fortified: { abv: 19.5, sugar: 98, temp: 16 },
  spirit: { abv: 43, sugar: 0, temp: 18 },
  beer: { abv: 5, sugar: 0, temp: 6 },
  cider: { abv: 6.2, sugar: 4, temp: 8 },
  low_alcohol: { abv: 0.5, sugar: 20, temp: 6 },
  other: { abv: 8, sugar: 10, temp: 10 },
}

const slug = (s: string) => s.toLowerCase().replace(/[^a-z0-9]+/g, '-')

async function png(svg: string): Promise<PNG> {
  const buf = await sharp(Buffer.from(svg)).resize({ width: WIDTH_PX }).flatten({ background: '#ffffff' }).png().toBuffer()
  return PNG.sync.read(buf)
}

describe('the glass drawing looks as its reference images', () => {
  for (const kind of PRODUCT_KINDS) {
    for (const glass of DEFAULT_GLASSES) {
      const name = `${kind}--${slug(glass.name)}.png`
      it(`${kind} in the ${glass.name.toLowerCase()}`, async () => {
        const t = TYPICAL[kind]
        const film = computeFilm({ abvPctVol: t.abv, tempC: t.temp, sugarGL: t.sugar, wallAngleDeg: glass.wallAngleDeg, kind: drinkKindOf(kind) })
        const drawing = glassDrawing({ glass, prediction: film.predictions, colour: DEFAULT_COLOUR_BY_KIND[kind], palette: 'light', label: kind, labels: false })
        const actual = await png(glassDrawingSvg(drawing, { widthPx: WIDTH_PX }))
        const file = join(DIR, name)
        if (UPDATE || !existsSync(file)) {
          mkdirSync(DIR, { recursive: true })
          writeFileSync(file, PNG.sync.write(actual))
          expect.fail(`Wrote the reference ${name}: look at it, commit it and run again.`)
        }
        const expected = PNG.sync.read(readFileSync(file))
        expect([actual.width, actual.height]).toEqual([expected.width, expected.height])
        const differing = pixelmatch(actual.data, expected.data, undefined, actual.width, actual.height, { threshold: THRESHOLD })
        expect(differing / (actual.width * actual.height)).toBeLessThanOrEqual(MAX_DIFF_SHARE)
      })
    }
  }
})
