import { describe, it, expect } from 'vitest'
import fc from 'fast-check'
import { computeFilm } from '../../../shared/science/glassModel'
import { QUALITY_DISCLAIMER, abvText, describePour, rangeText } from '../../../shared/science/predictions'

const text = (input: Parameters<typeof computeFilm>[0], unit: 'C' | 'F' = 'C') => describePour(computeFilm(input), { temperatureUnit: unit }).join(' ')
const plain = (s: string) => s.replace(/\u00a0/g, ' ')

describe('describePour: the numbers in the text are the model\'s', () => {
  it('gives the band, first tears, count and speed as the predicted ranges, not two significant figures of one value', () => {
    const r = computeFilm({ abvPctVol: 12.5, tempC: 18, sugarGL: 3 })
    const t = describePour(r).join(' ')
    const g = r.predictions.ranges
    expect(t).toContain(rangeText(g.clearBandHeight_mm!, 'mm'))
    expect(t).toContain(rangeText(g.tearOnset_s!, 's'))
    expect(t).toContain(rangeText(g.tearFallSpeed_mm_s!, 'mm/s'))
    expect(t).toContain(`${Math.round(g.tearsAround!.low)}–${Math.round(g.tearsAround!.high)} around the glass`)
    expect(t).not.toContain('µm') // film thickness is not something a guest can check
    expect(t).toContain('Marangoni')
    expect(t).toContain(r.surfaceTensionBulk_mN_m.toFixed(1))
    expect(t).not.toMatch(/NaN|undefined|Infinity|null/)
  })

  it('states the ABV exactly as the lab sheet does', () => {
    expect(plain(text({ abvPctVol: 13.6, tempC: 16, sugarGL: 2 }))).toContain('At 13.6 % ABV')
    expect(plain(text({ abvPctVol: 40, tempC: 20, sugarGL: 0, kind: 'spirit' }))).toContain('At 40 % ABV')
    expect(abvText(12.45)).toBe('12.45')
    expect(abvText(14)).toBe('14')
  })

  it('says where its numbers hold: clean glass, still air, the room\'s humidity and temperature', () => {
    const t = plain(text({ abvPctVol: 12, tempC: 14, sugarGL: 0, room: { relativeHumidityPct: 62, airTempC: 23 } }))
    expect(t).toContain('clean glass in still air at 62 % humidity and 23 °C')
  })

  it('speaks Fahrenheit when the venue does', () => {
    expect(plain(text({ abvPctVol: 12.5, tempC: 18, sugarGL: 3 }, 'F'))).toContain('64 °F')
  })

  it('formats ranges and collapses equal ends', () => {
    expect(plain(rangeText({ low: 6.14, high: 19.2 }, 'mm'))).toBe('6.1–19 mm')
    expect(plain(rangeText({ low: 2.31, high: 2.34 }, 'mm'))).toBe('about 2.3 mm')
  })
})

describe('describePour: every case says what the model computes', () => {
  it('always ends with the quality statement and never prints a broken number', () => {
    fc.assert(
      fc.property(fc.double({ min: 0, max: 100, noNaN: true }), fc.double({ min: 0, max: 40, noNaN: true }), fc.double({ min: 0, max: 300, noNaN: true }), fc.double({ min: 0, max: 100, noNaN: true }), fc.constantFrom('still', 'sparkling', 'fortified', 'spirit', 'cider', 'beer', 'low_alcohol', 'other' as const), (abv, t, s, rh, kind) => {
        const r = computeFilm({ abvPctVol: abv, tempC: t, sugarGL: s, kind, room: { relativeHumidityPct: rh, airTempC: 21 } })
        const lines = describePour(r)
        const all = lines.join(' ')
        expect(lines[lines.length - 1]).toBe(QUALITY_DISCLAIMER)
        expect(all).not.toMatch(/NaN|undefined|Infinity|null/)
        // no sentence contradicts the prediction beside it
        if (r.predictions.tearsExpected) {
          expect(all).toMatch(/tears —|legs —/)
          expect(all).not.toMatch(/no distinct tears|no tears|no climbing film/)
        }
        else {
          expect(all).not.toMatch(/tears —|legs —/)
        }
      }),
      { numRuns: 60 },
    )
  })

  it('no alcohol: no climbing film', () => {
    expect(text({ abvPctVol: 0, tempC: 20, sugarGL: 0 })).toMatch(/no climbing film/)
  })

  it('beer: foam rings, not tears', () => {
    expect(text({ abvPctVol: 5, tempC: 6, sugarGL: 0, kind: 'beer' })).toMatch(/rings of foam.*not tears/)
  })

  it('a dealcoholised wine: the surface is held still', () => {
    expect(text({ abvPctVol: 0.4, tempC: 10, sugarGL: 30, kind: 'low_alcohol' })).toMatch(/hold still: expect no clear band and no distinct tears/)
  })

  it('sparkling: the foam comes first', () => {
    expect(text({ abvPctVol: 12, tempC: 8, sugarGL: 8, kind: 'sparkling' })).toMatch(/once the foam has settled/)
  })

  it('a humid room that gives a strong pour water says so', () => {
    const r = computeFilm({ abvPctVol: 70, tempC: 20, sugarGL: 0, kind: 'spirit', room: { relativeHumidityPct: 85, airTempC: 22 } })
    expect(r.waterFlux_kg_m2_s).toBeLessThan(0)
    if (r.predictions.tearsExpected) expect(describePour(r).join(' ')).toMatch(/takes water up from the air/)
  })
})

describe('a 12 % table wine, a 20 % fortified wine and a 40 % spirit in the same glass and room', () => {
  const room = { relativeHumidityPct: 50, airTempC: 21 }
  const wine = computeFilm({ abvPctVol: 12, tempC: 16, sugarGL: 2, kind: 'still', room })
  const port = computeFilm({ abvPctVol: 20, tempC: 16, sugarGL: 100, kind: 'fortified', room })
  const spirit = computeFilm({ abvPctVol: 40, tempC: 16, sugarGL: 0, kind: 'spirit', room })

  it('all show tears; the spirit\'s and the sweet wine\'s fall slower than the table wine\'s, as the trade sees', () => {
    for (const r of [wine, port, spirit]) expect(r.predictions.tearsExpected).toBe(true)
    // the trade: whisky, rum and port show the slowest, most prominent legs (common practice, no source)
    expect(spirit.predictions.tearFallSpeed_mm_s!).toBeLessThan(wine.predictions.tearFallSpeed_mm_s!)
    expect(port.predictions.tearFallSpeed_mm_s!).toBeLessThan(wine.predictions.tearFallSpeed_mm_s!)
    // viscosity is why (Bingham & Jackson 1917: 2.9 mPa·s at 40 % mass vs 1.5 at 10 % mass, 20 °C; ×1.3 for 100 g/L sucrose)
    expect(spirit.viscosity_mPa_s).toBeGreaterThan(wine.viscosity_mPa_s)
    expect(port.viscosity_mPa_s).toBeGreaterThan(wine.viscosity_mPa_s)
  })

  it('the spirit\'s text compares it with a table wine in the words its numbers give', () => {
    const t = plain(describePour(spirit).join(' '))
    const slower = Math.round(100 * (1 - spirit.predictions.tearFallSpeed_mm_s! / computeFilm({ abvPctVol: 12, tempC: 16, sugarGL: 0, kind: 'still', room }).predictions.tearFallSpeed_mm_s!))
    expect(t).toContain('Against a 12 % table wine in the same glass and room')
    expect(t).toContain(`tears that fall about ${slower} % slower`)
    expect(t).not.toMatch(/weaker and later/)
  })

  it('the sweet wine\'s text puts its slower tears down to sugar\'s viscosity, with the model\'s factor', () => {
    const t = plain(describePour(port).join(' '))
    expect(t).toContain('100 g/L of sugar')
    expect(t).toContain(`${Number(port.sugarViscosityFactor.toFixed(1))} times as viscous`)
  })

  it('the index follows the climbing flux: the table wine highest', () => {
    expect(wine.filmActivityIndex).toBeGreaterThan(spirit.filmActivityIndex)
    expect(wine.filmActivityIndex).toBeGreaterThan(port.filmActivityIndex)
  })
})
