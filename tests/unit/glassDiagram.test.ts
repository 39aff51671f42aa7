import { describe, expect, it } from 'vitest'
import { glassDiagramGeometry, type GlassShape } from '../../shared/glassDiagram'
import { computeFilm, describePour, rangeText } from '../../shared/science'
import { roomText, tearFigures } from '../../shared/tearFigures'
import { DEFAULT_GLASSES } from '../../server/demo/data'

const tulip: GlassShape = DEFAULT_GLASSES.find(g => g.name === 'Tulip wine glass')!
const nosing: GlassShape = DEFAULT_GLASSES.find(g => g.name === 'Nosing glass')!

/** The model's own cases, each checked for the state it is meant to show before the diagram is. */
const wine = computeFilm({ abvPctVol: 12.5, tempC: 16, sugarGL: 2, wallAngleDeg: tulip.wallAngleDeg, kind: 'still' })
const strongSpirit = computeFilm({ abvPctVol: 60, tempC: 18, sugarGL: 0, wallAngleDeg: nosing.wallAngleDeg, kind: 'spirit' })
const beer = computeFilm({ abvPctVol: 5, tempC: 6, sugarGL: 0, kind: 'beer' })
const heldStill = computeFilm({ abvPctVol: 43, tempC: 18, sugarGL: 0, kind: 'still' })

/** "12 mm" or "4.5 mm/s" not preceded by an en dash: a lone value where a range belongs. */
const LONE_MM = /(?<![–\d.])\d+(?:\.\d+)?\s?mm/u

/** A sans-serif's widest common characters average about 0.6 em (common practice, no source). */
const CHAR_EM = 0.6

function box(viewBox: string) {
  const [x, y, w, h] = viewBox.split(' ').map(Number) as [number, number, number, number]
  return { x, y, right: x + w, bottom: y + h }
}

describe('the glass diagram labels ranges', () => {
  it('a table wine: a clear band labelled with its range, the text with band and speed ranges', () => {
    expect(wine.predictions.tearsExpected && wine.predictions.bandVisible).toBe(true)
    const g = glassDiagramGeometry(tulip, wine.predictions)
    const band = rangeText(wine.predictions.ranges.clearBandHeight_mm!, 'mm')
    const speed = rangeText(wine.predictions.ranges.tearFallSpeed_mm_s!, 'mm/s')
    expect(g.show).toBe('band')
    expect(band).toMatch(/\d–\d/)
    expect(g.labels.map(l => l.lines.join(' '))).toContain(`clear band ${band}`)
    const text = g.description('Albariño')
    expect(text).toContain(band)
    expect(text).toContain(speed)
    expect(text).not.toMatch(LONE_MM)
    expect(g.tears.length).toBeGreaterThan(0)
  })

  it('tears without a visible band: a low band, the swirled wall and legs hanging below the swirl line', () => {
    const p = strongSpirit.predictions
    expect(p.tearsExpected).toBe(true)
    expect(p.bandVisible).toBe(false)
    const g = glassDiagramGeometry(nosing, p)
    expect(g.show).toBe('swirl')
    expect(g.swirl).not.toBeNull()
    expect(g.band).not.toBeNull()
    const swirlY = g.swirl!.line.y
    const bandTop = g.band!.ridge.y
    expect(swirlY).toBeLessThan(bandTop - 10) // the swirl line stands well above the low band
    expect(g.tears.length).toBeGreaterThan(0)
    for (const t of g.tears) {
      expect(t.y).toBeGreaterThan(swirlY)
      expect(t.y).toBeLessThan(bandTop)
    }
    const labels = g.labels.map(l => l.lines.join(' '))
    expect(labels).toContain(`low band ${rangeText(p.ranges.clearBandHeight_mm!, 'mm')}`)
    expect(labels).toContain('legs run from the swirl line')
    const text = g.description('Cask strength')
    expect(text).toContain('legs')
    expect(text).toContain(rangeText(p.ranges.tearFallSpeed_mm_s!, 'mm/s'))
    expect(text).not.toMatch(LONE_MM)
  })

  it('beer draws foam rings and no band, although the film would climb', () => {
    expect(beer.predictions.suppressedBy).toBe('foam')
    expect(beer.predictions.clearBandHeight_mm).toBeGreaterThan(0)
    const g = glassDiagramGeometry(tulip, beer.predictions)
    expect(g.show).toBe('foam')
    expect(g.band).toBeNull()
    expect(g.tears).toHaveLength(0)
    expect(g.rings.length).toBeGreaterThan(0)
    expect(g.labels.map(l => l.lines.join(' '))).toContain('foam rings, no tears')
    expect(g.description('Pale ale')).toContain('foam')
  })

  it('a surface held still gets no band drawn and says there are no distinct tears', () => {
    expect(heldStill.predictions.suppressedBy).toBe('held')
    const g = glassDiagramGeometry(nosing, heldStill.predictions)
    expect(g.band).toBeNull()
    expect(g.tears).toHaveLength(0)
    expect(g.description('Still 43')).toContain('no distinct tears')
  })

  it('without ranges (a sample shape), the label still reads "about", never a bare number', () => {
    const g = glassDiagramGeometry(tulip, { tearsExpected: true, clearBandHeight_mm: 10, meniscusHeight_mm: 2, tearWidth_mm: 2.2, tearFallSpeed_mm_s: 8 })
    expect(g.labels.map(l => l.lines.join(' '))).toContain('clear band about\u00a010\u00a0mm')
  })

  it('every label fits inside the labelled view, and no two labels overlap, for every demo glass', () => {
    for (const glass of DEFAULT_GLASSES) {
      for (const film of [wine, strongSpirit, beer, heldStill]) {
        const g = glassDiagramGeometry(glass, film.predictions)
        const v = box(g.labelledViewBox)
        const blocks = g.labels.map(l => ({ top: l.y - g.font, bottom: l.y + (l.lines.length - 1) * g.lineHeight + 0.3 * g.font, width: Math.max(...l.lines.map(s => s.length)) * g.font * CHAR_EM }))
        for (const b of blocks) {
          expect(g.labelX + b.width, glass.name).toBeLessThanOrEqual(v.right)
          expect(b.top, glass.name).toBeGreaterThanOrEqual(v.y)
          expect(b.bottom, glass.name).toBeLessThanOrEqual(v.bottom)
        }
        const sorted = [...blocks].sort((a, b) => a.top - b.top)
        for (let i = 1; i < sorted.length; i++) expect(sorted[i]!.top, glass.name).toBeGreaterThanOrEqual(sorted[i - 1]!.bottom - 0.31 * g.font)
      }
    }
  })
})

describe('the figures beside the text', () => {
  it('say what describePour says: every figure appears in the full text, with the room it assumes', () => {
    for (const film of [wine, strongSpirit]) {
      const text = describePour(film, { temperatureUnit: 'F' }).join(' ')
      const figures = tearFigures(film.predictions)
      const lowBand = !film.predictions.bandVisible
      expect(figures.map(f => f.key)).toEqual(lowBand ? ['band', 'around', 'speed', 'show'] : ['band', 'onset', 'around', 'speed', 'show'])
      for (const f of figures) {
        // The text says a low band "stays low" in words; the figure gives its range.
        if (lowBand && f.key === 'band') expect(text).toContain('stays low')
        else expect(text, f.key).toContain(f.value)
      }
      // 50 % and 21 °C = 70 °F: the model's default room (DEFAULT_ROOM_AIR).
      expect(roomText(film.inputs.room, 'f')).toBe('a clean glass in still air at 50\u00a0% humidity and 70\u00a0°F')
      expect(text).toContain(roomText(film.inputs.room, 'f'))
    }
  })

  it('name the band a low one when it stays inside the meniscus, and give none when no tears run', () => {
    expect(tearFigures(strongSpirit.predictions)[0]!.label).toMatch(/stays low/)
    expect(tearFigures(wine.predictions)[0]!.label).toBe('Clear band above the liquid')
    expect(tearFigures(beer.predictions)).toEqual([])
    expect(tearFigures(heldStill.predictions)).toEqual([])
  })
})
