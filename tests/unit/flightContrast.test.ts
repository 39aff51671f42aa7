import { describe, expect, it } from 'vitest'
import { DEFAULT_ROOM_AIR, computeFilm, rangeText, type FilmResult } from '../../shared/science'
import { flightContrasts } from '../../shared/flightContrast'

/** Invented pours (no real product): ABV % vol, serving °C, sugar g/L, kind, glass wall angle. */
const POURS = [
  { abv: 6, temp: 8, sugar: 4, kind: 'cider' as const },
  { abv: 11.8, temp: 7, sugar: 8, kind: 'sparkling' as const },
  { abv: 12.5, temp: 10, sugar: 2, kind: 'still' as const },
  { abv: 13.6, temp: 16, sugar: 1.5, kind: 'still' as const },
  { abv: 19.5, temp: 16, sugar: 98, kind: 'fortified' as const },
  { abv: 43, temp: 18, sugar: 0, kind: 'spirit' as const },
]
const films = POURS.map(p => computeFilm({ abvPctVol: p.abv, tempC: p.temp, sugarGL: p.sugar, kind: p.kind, wallAngleDeg: 75, room: { relativeHumidityPct: 62, airTempC: 20.5 } }))
const flight = films.map((film, i) => ({ position: i + 1, film }))
const banded = (f: FilmResult) => f.predictions.tearsExpected && f.predictions.bandVisible

describe('what sets each pour apart within its flight', () => {
  const lines = flightContrasts(flight)

  it('gives every pour one line, and no claim to two pours', () => {
    expect(lines.map(l => l.position)).toEqual([1, 2, 3, 4, 5, 6])
    const claims = lines.map(l => l.claim).filter(c => c !== 'rank')
    expect(new Set(claims).size).toBe(claims.length)
  })

  it('names the highest band where the model puts it, with that pour\'s own range', () => {
    const top = flight.filter(p => banded(p.film)).sort((a, b) => b.film.predictions.clearBandHeight_mm - a.film.predictions.clearBandHeight_mm)[0]!
    const line = lines.find(l => l.claim === 'highest')!
    expect(line.position).toBe(top.position)
    expect(line.text).toContain(rangeText(top.film.predictions.ranges.clearBandHeight_mm!, 'mm'))
  })

  it('singles out the sugar of the sweetest pour when it slows the tears', () => {
    const line = lines.find(l => l.claim === 'sugar')!
    expect(line.position).toBe(5)
    expect(line.text).toMatch(/98\u00a0g\/L of sugar slows everything/)
    expect(line.text).toContain(rangeText(films[4]!.predictions.ranges.tearFallSpeed_mm_s!, 'mm/s'))
  })

  it('says "first to show tears" of the pour with the shortest central onset', () => {
    const first = [...flight].sort((a, b) => (a.film.predictions.tearOnset_s ?? Infinity) - (b.film.predictions.tearOnset_s ?? Infinity))[0]!
    const holder = lines.find(l => l.claim === 'first' || l.also?.includes('first to show tears'))!
    expect(holder.position).toBe(first.position)
  })

  it('places the rest by their band\'s height, with its range', () => {
    for (const l of lines.filter(x => x.claim === 'rank')) {
      const f = films[l.position - 1]!
      expect(l.text).toMatch(/^(Second|Third|Fourth|Fifth|Sixth)-highest band of the (five|six): /)
      expect(l.text).toContain(rangeText(f.predictions.ranges.clearBandHeight_mm!, 'mm'))
    }
  })

  it('says that beer\'s foam holds still, and makes no claim for a flight of one', () => {
    const beer = computeFilm({ abvPctVol: 5, tempC: 6, sugarGL: 5, kind: 'beer', room: DEFAULT_ROOM_AIR })
    const withBeer = flightContrasts([{ position: 1, film: beer }, ...flight.slice(2, 4).map((p, i) => ({ ...p, position: i + 2 }))])
    expect(withBeer[0]).toMatchObject({ position: 1, claim: 'foam' })
    expect(flightContrasts([flight[0]!])).toEqual([])
  })
})
