import { describe, expect, it } from 'vitest'
import { glassDrawing, glassDrawingSvg, textWidth, type DrawItem, type GlassDrawing, type GlassShape } from '../../shared/glassDrawing'
import { LIQUID_COLOUR_FILL, liquidColourOf } from '../../shared/liquidColours'
import { computeFilm, rangeText } from '../../shared/science'
import { DEFAULT_GLASSES, DEMO_PRODUCTS } from '../../server/demo/data'

const tulip: GlassShape = DEFAULT_GLASSES.find(g => g.name === 'Tulip wine glass')!
const nosing: GlassShape = DEFAULT_GLASSES.find(g => g.name === 'Nosing glass')!
const cabFranc = DEMO_PRODUCTS.find(p => p.code === 'SV-CF-23')!

/** The model's own cases, each checked for the state it is meant to show before it is drawn. */
const red = computeFilm({ abvPctVol: cabFranc.abvPctVol, tempC: cabFranc.servingTempC, sugarGL: cabFranc.residualSugarGL, wallAngleDeg: tulip.wallAngleDeg, kind: 'still' })
const strongSpirit = computeFilm({ abvPctVol: 60, tempC: 18, sugarGL: 0, wallAngleDeg: nosing.wallAngleDeg, kind: 'spirit' })
const beer = computeFilm({ abvPctVol: 5, tempC: 6, sugarGL: 0, kind: 'beer' })
const heldStill = computeFilm({ abvPctVol: 43, tempC: 18, sugarGL: 0, kind: 'still' })

const draw = (glass: GlassShape, prediction: typeof red.predictions, labels = true, colour = liquidColourOf(cabFranc)) =>
  glassDrawing({ glass, prediction, colour, palette: 'light', label: 'Test pour', labels })
const byRole = (d: GlassDrawing, role: string) => d.items.filter(i => i.role === role)
const texts = (d: GlassDrawing) => d.items.filter((i): i is Extract<DrawItem, { kind: 'text' }> => i.kind === 'text')

/** "12 mm" not preceded by an en dash: a lone value where a range belongs. */
const LONE_MM = /(?<![–\d.])\d+(?:\.\d+)?\s?mm(?!\w)/u

describe('the glass drawing, to scale', () => {
  it('marks the band top on the scale at clearBandHeight · sin(wall) above the liquid line', () => {
    const p = red.predictions
    expect(p.tearsExpected && p.bandVisible).toBe(true)
    const d = draw(tulip, p)
    expect(d.show).toBe('band')
    const ridge = byRole(d, 'ridge')[0] as Extract<DrawItem, { kind: 'line' }>
    const sinW = Math.sin((tulip.wallAngleDeg * Math.PI) / 180)
    // The liquid line is y = 0 and y grows downward; coordinates are rounded to 0.1 mm.
    expect(ridge.y1).toBeCloseTo(-p.clearBandHeight_mm * sinW, 1)
    // The band's mark ends on the scale at the point clearBandHeight mm from its zero.
    const mark = byRole(d, 'band-mark')[0] as Extract<DrawItem, { kind: 'line' }>
    const onScale = { x: d.scale.x0 + p.clearBandHeight_mm * d.scale.ux, y: d.scale.y0 + p.clearBandHeight_mm * d.scale.uy }
    // The mark runs out past the scale line by the major ticks' length (2.2 mm) along the normal.
    expect(Math.hypot(mark.x2 - onScale.x, mark.y2 - onScale.y)).toBeCloseTo(2.2, 0)
    expect(d.scale.y0 + p.clearBandHeight_mm * d.scale.uy - d.scale.y0).toBeCloseTo(-p.clearBandHeight_mm * sinW, 1)
  })

  it('draws the scale with ticks 1 mm apart along the wall, numbered from 0 at the liquid line', () => {
    const d = draw(tulip, red.predictions)
    const ticks = (byRole(d, 'scale-ticks')[0] as Extract<DrawItem, { kind: 'path' }>).d
    const starts = [...ticks.matchAll(/M(-?[\d.]+),(-?[\d.]+)/g)].map(m => ({ x: Number(m[1]), y: Number(m[2]) }))
    expect(starts.length).toBeGreaterThan(10)
    // Minor ticks skip every fifth millimetre (those are major); neighbours are 1 mm apart.
    let ones = 0
    for (let i = 1; i < starts.length; i++) {
      const gap = Math.hypot(starts[i]!.x - starts[i - 1]!.x, starts[i]!.y - starts[i - 1]!.y)
      if (gap < 1.5) {
        expect(gap).toBeGreaterThan(0.9)
        expect(gap).toBeLessThan(1.1)
        ones++
      }
      else expect(gap).toBeCloseTo(2, 0)
    }
    expect(ones).toBeGreaterThan(5)
    const numbers = byRole(d, 'scale-number').map(t => (t as Extract<DrawItem, { kind: 'text' }>).text)
    expect(numbers[0]).toBe('0')
    expect(numbers.at(-1)).toMatch(/^\d+ mm$/)
  })

  it('shades the band\'s whole range on the scale and labels the range, never a lone value', () => {
    const p = red.predictions
    const d = draw(tulip, p)
    const range = byRole(d, 'range')
    expect(range).toHaveLength(1)
    const nums = (range[0] as Extract<DrawItem, { kind: 'path' }>).d.match(/-?[\d.]+/g)!.map(Number)
    const ys = nums.filter((_, i) => i % 2 === 1)
    const sinW = Math.sin((tulip.wallAngleDeg * Math.PI) / 180)
    const span = Math.max(...ys) - Math.min(...ys)
    const r = p.ranges.clearBandHeight_mm!
    // The shaded span's height is (high − low) · sin(wall), give or take the rounding and the
    // perpendicular offset of its inner edge (cos(wall) · 1.8 mm).
    expect(span).toBeGreaterThan((r.high - r.low) * sinW - 0.3)
    expect(span).toBeLessThan((r.high - r.low) * sinW + 1.8 * Math.cos((tulip.wallAngleDeg * Math.PI) / 180) + 0.3)
    const labels = texts(d).filter(t => t.role === 'label').map(t => t.text)
    expect(labels).toContain(rangeText(r, 'mm'))
    expect(d.description).toContain(rangeText(r, 'mm'))
    expect(d.description).toContain(rangeText(p.ranges.tearFallSpeed_mm_s!, 'mm/s'))
    expect(d.description).not.toMatch(LONE_MM)
  })

  it('draws half the tears around on the front face, each as wide as predicted at the front', () => {
    const p = red.predictions
    expect(p.tearsAround).toBeGreaterThan(2)
    const d = draw(tulip, p)
    const tears = byRole(d, 'tear')
    expect(tears).toHaveLength(Math.min(14, Math.round(p.tearsAround! / 2)))
    expect(d.tears.drawn).toBe(tears.length)
    // The drawn spacing along the ridge's front half-circle is the model's spacing when not capped.
    if (tears.length < 14) expect(d.tears.spacingMm!).toBeCloseTo(p.tearSpacing_mm!, -0.3)
    // The widest tear (the one facing us) is tearWidth_mm wide, to 0.2 mm of rounding.
    const widths = tears.map((t) => {
      const xs = (t as Extract<DrawItem, { kind: 'path' }>).d.match(/-?[\d.]+/g)!.map(Number).filter((_, i) => i % 2 === 0)
      return Math.max(...xs) - Math.min(...xs)
    })
    expect(Math.max(...widths)).toBeGreaterThan(p.tearWidth_mm! - 0.25)
    expect(Math.max(...widths)).toBeLessThan(p.tearWidth_mm! + 0.25)
    // More tears around means more drawn: a narrower spacing on the same glass.
    const denser = draw(tulip, { ...p, tearsAround: p.tearsAround! * 0.5, tearSpacing_mm: p.tearSpacing_mm! * 2 })
    expect(byRole(denser, 'tear').length).toBeLessThan(tears.length)
  })

  it('a strong spirit: a low band, the swirl line above it and legs hanging below the swirl line', () => {
    const p = strongSpirit.predictions
    expect(p.tearsExpected).toBe(true)
    expect(p.bandVisible).toBe(false)
    const d = draw(nosing, p)
    expect(d.show).toBe('swirl')
    const swirl = byRole(d, 'swirl-line')[0] as Extract<DrawItem, { kind: 'line' }>
    const ridge = byRole(d, 'ridge')[0] as Extract<DrawItem, { kind: 'line' }>
    expect(swirl.y1).toBeLessThan(ridge.y1 - 10)
    for (const t of byRole(d, 'tear')) {
      const ys = (t as Extract<DrawItem, { kind: 'path' }>).d.match(/-?[\d.]+/g)!.map(Number).filter((_, i) => i % 2 === 1)
      expect(Math.min(...ys)).toBeGreaterThanOrEqual(swirl.y1 - 0.05)
      expect(Math.max(...ys)).toBeLessThan(ridge.y1)
    }
    const labels = texts(d).map(t => t.text)
    expect(labels).toContain('low band')
    expect(labels).toContain('legs run from')
    expect(d.description).toContain('legs')
  })

  it('beer draws foam rings and no tears; a surface held still draws neither', () => {
    expect(beer.predictions.suppressedBy).toBe('foam')
    const foam = draw(tulip, beer.predictions)
    expect(foam.show).toBe('foam')
    expect(byRole(foam, 'foam').length).toBe(3)
    expect(byRole(foam, 'tear')).toHaveLength(0)
    expect(byRole(foam, 'film')).toHaveLength(0)
    expect(foam.description).toContain('foam')
    expect(heldStill.predictions.tearsExpected).toBe(false)
    const none = draw(nosing, heldStill.predictions)
    expect(none.show).toBe('none')
    expect(byRole(none, 'tear')).toHaveLength(0)
    expect(byRole(none, 'ridge')).toHaveLength(0)
    expect(texts(none).map(t => t.text)).toContain('no clear band,')
  })

  it('paints the liquid in the product\'s colour: a ruby Cabernet Franc is not straw', () => {
    expect(liquidColourOf(cabFranc)).toBe('ruby')
    const d = draw(tulip, red.predictions)
    const liquid = byRole(d, 'liquid')[0] as Extract<DrawItem, { kind: 'path' }>
    expect(liquid.fill).toBe(LIQUID_COLOUR_FILL.ruby.hex)
    expect(liquid.fill).not.toBe(LIQUID_COLOUR_FILL.straw.hex)
    for (const t of byRole(d, 'tear')) expect((t as Extract<DrawItem, { kind: 'path' }>).fill).toBe(LIQUID_COLOUR_FILL.ruby.hex)
    // The dark palette changes the outline and the labels, not the liquid.
    const dark = glassDrawing({ glass: tulip, prediction: red.predictions, colour: 'ruby', palette: 'dark', label: 'x', labels: true })
    expect((byRole(dark, 'liquid')[0] as Extract<DrawItem, { kind: 'path' }>).fill).toBe(LIQUID_COLOUR_FILL.ruby.hex)
    expect((byRole(dark, 'glass')[0] as Extract<DrawItem, { kind: 'path' }>).stroke).not.toBe((byRole(d, 'glass')[0] as Extract<DrawItem, { kind: 'path' }>).stroke)
  })

  it('no coordinate carries more than two decimals, and every label lies inside the viewBox', () => {
    const cases = [red, strongSpirit, beer, heldStill]
    for (const glass of DEFAULT_GLASSES) {
      for (const film of cases) {
        for (const labels of [true, false]) {
          const d = draw(glass, film.predictions, labels)
          const svg = glassDrawingSvg(d)
          // Every number in the SVG's attributes (paths included) has at most two decimals.
          const attrs = svg.replace(/<title>[^<]*<\/title>/, '').replace(/>[^<]*</g, '><')
          expect(attrs.match(/\d\.\d{3,}/g)).toBeNull()
          const v = d.viewBox
          for (const t of texts(d)) {
            const w = textWidth(t)
            const left = t.anchor === 'start' ? t.x : t.anchor === 'middle' ? t.x - w / 2 : t.x - w
            // Lora's and sans-serif's average glyph is under 0.6 em (common practice, no source).
            expect(left).toBeGreaterThanOrEqual(v.x)
            expect(left + t.text.length * t.size * 0.6).toBeLessThanOrEqual(v.x + v.width)
            expect(t.y - t.size).toBeGreaterThanOrEqual(v.y)
            expect(t.y + t.size * 0.3).toBeLessThanOrEqual(v.y + v.height)
          }
          if (!labels) expect(texts(d)).toHaveLength(0)
        }
      }
    }
  })
})
