import { describe, expect, it } from 'vitest'
import { computeCurve, computeFilm } from '../../shared/science/glassModel'
import { guestFlight, listedSession, roundSignificant, sessionsOnSale } from '../../shared/flightPage'
import { tearFigures, tearSummary } from '../../shared/tearFigures'
import { glassDrawing } from '../../shared/glassDrawing'
import { filmCurveReading, filmCurveSummary } from '../../utils/filmCurve'
import type { FlightPourView, FlightView } from '../../shared/types/flights'
import type { PublicSession } from '../../shared/types/sessions'

// The pours are this test's own (invented for the test, not outside data): a cider, a wine and a
// spirit, so the trimmed page data is checked on a band with tears, on a wine and on a whisky-strength pour.
const glass = { id: 3, name: 'Tulip', bowlDiameterMm: 76, wallAngleDeg: 78, fillHeightMm: 32 }
function pour(position: number, abvPctVol: number, tempC: number, sugarGL: number, kind: 'cider' | 'still' | 'spirit'): FlightPourView {
  const film = computeFilm({ abvPctVol, tempC, sugarGL, kind, wallAngleDeg: glass.wallAngleDeg, bowlDiameterMm: glass.bowlDiameterMm, pourVolumeMl: 60 })
  return {
    position, productId: position,
    product: { code: `T-${position}`, name: `Test pour ${position}`, kind: kind === 'still' ? 'still_wine' : kind, producer: 'Test cellar', vintageOrBatch: null, colour: null, allergens: ['sulfites'], status: 'active' },
    abvPctVol, residualSugarGL: sugarGL, measuredOn: '2026-09-01', volumeMl: 60, servingTempC: tempC, note: 'staff only',
    glass, ethanolGrams: 60 * abvPctVol / 100 * 0.789, standardDrinks: 60 * abvPctVol / 100 * 0.789 / 14,
    filmActivityIndex: film.filmActivityIndex, film,
    tastingNote: { html: '<p>Note</p>', text: 'Note', blocks: [] },
    photo: { id: 9, productId: position, role: 'photo', src: 'a.jpg', mimeType: 'image/jpeg', bytes: 1000, width: 800, height: 1000, altText: 'A bottle' },
  } as FlightPourView
}
const view = {
  id: 7, lineageId: 7, version: 1, name: 'Test flight', summary: 'Three pours', status: 'published', publishedAt: null, updatedAt: '2026-09-01T00:00:00Z',
  sessionCount: 0, locked: false,
  intro: { html: '<p>Hello</p>', text: 'Hello '.repeat(60), blocks: [] },
  pours: [pour(1, 6.2, 8, 4, 'cider'), pour(2, 13.5, 16, 2, 'still'), pour(3, 46, 18, 0, 'spirit')],
  totals: { volumeMl: 180, ethanolGrams: 31.234567, standardDrinks: 2.2310405, limitGrams: 60, overLimit: false },
} as unknown as FlightView

describe('the public flight page keeps what it shows', () => {
  it('rounds numbers to significant digits and leaves everything else alone', () => {
    expect(roundSignificant(53.818632501841)).toBe(53.82)
    expect(roundSignificant(0.003619609823757467)).toBe(0.00362)
    expect(roundSignificant(1234567.89)).toBe(1235000)
    expect(roundSignificant({ a: [1.23456, null, 'x', true], b: { c: -0.000123456 } })).toEqual({ a: [1.235, null, 'x', true], b: { c: -0.0001235 } })
    expect(roundSignificant(0)).toBe(0)
  })

  it('draws and words every pour exactly as the full model data does, with less than a third of the bytes', () => {
    const guest = guestFlight(view)
    for (const [i, p] of view.pours.entries()) {
      const g = guest.pours[i]!
      expect(tearFigures(g.film.predictions)).toEqual(tearFigures(p.film.predictions))
      expect(tearSummary(g.film.predictions)).toBe(tearSummary(p.film.predictions))
      const drawing = (prediction: typeof p.film.predictions | typeof g.film.predictions, gl: typeof glass | typeof g.glass) => glassDrawing({ glass: gl, prediction, colour: 'straw', palette: 'light', label: 'x', labels: false })
      expect(drawing(g.film.predictions, g.glass)).toEqual(drawing(p.film.predictions, p.glass))
      expect(g.film.inputs.room).toEqual(p.film.inputs.room)
      expect(g.product.allergens).toEqual(['sulfites'])
      expect(g.tastingNote).toEqual({ html: '<p>Note</p>' })
      expect(g.photo).toEqual({ src: 'a.jpg', width: 800, height: 1000, altText: 'A bottle' })
    }
    const text = JSON.stringify(guest)
    for (const staffOrModel of ['solventMoleFraction', 'calibration', 'staff only', 'measuredOn', 'filmThickness_um', 'blocks']) expect(text).not.toContain(staffOrModel)
    expect(text.length).toBeLessThan(JSON.stringify(view).length / 3)
    expect(guest.intro!.text.length).toBe(200)
    expect(guest.totals).toEqual({ volumeMl: 180, ethanolGrams: 31.23, standardDrinks: 2.231 })
  })

  it('lists a session without the flight the page already names', () => {
    const s = { id: 1, flightId: 7, flightName: 'Test flight', startsAt: '2026-12-05T19:00:00Z', startsLocal: '2026-12-05 14:00', endsAt: '2026-12-05T20:00:00Z', durationMinutes: 60, seats: 8, seatsLeft: 3, priceMinor: 3000, currency: 'USD', bookingClosesAt: '2026-12-05T18:00:00Z', status: 'open', bookable: true, closedReason: null } as PublicSession
    const listed = listedSession(s)
    expect(Object.keys(listed)).not.toContain('flightName')
    expect(listed).toMatchObject({ id: 1, seatsLeft: 3, priceMinor: 3000, currency: 'USD', bookable: true })
  })

  it('sends the next six sessions whole, and the lowest price, the lengths and the count of all of them', () => {
    const base = { flightId: 7, flightName: 'Test flight', startsLocal: '', endsAt: '', seats: 8, seatsLeft: 3, currency: 'USD', bookingClosesAt: '', status: 'open', bookable: true, closedReason: null }
    const list = Array.from({ length: 25 }, (_, i) => ({ ...base, id: i + 1, startsAt: `2026-12-${String(i + 5).padStart(2, '0')}T19:00:00Z`, durationMinutes: i === 20 ? 90 : 60, priceMinor: i === 22 ? 2500 : 3000 })) as PublicSession[]
    const onSale = sessionsOnSale(list)
    expect(onSale.first.map(s => s.id)).toEqual([1, 2, 3, 4, 5, 6])
    // The cheapest and the longest sessions are past the sixth: the summary still tells of them.
    expect(onSale).toMatchObject({ count: 25, fromPriceMinor: 2500, minutes: { min: 60, max: 90 } })
    expect(JSON.stringify(onSale).length).toBeLessThan(JSON.stringify(list.map(listedSession)).length / 3)
    expect(sessionsOnSale([])).toEqual({ first: [], count: 0, fromPriceMinor: null, minutes: null })
    // A full session's lower price is not a price a guest can book.
    const full = list.map(s => (s.id === 23 ? { ...s, bookable: false, seatsLeft: 0 } : s))
    expect(sessionsOnSale(full).fromPriceMinor).toBe(3000)
    expect(sessionsOnSale(full.map(s => ({ ...s, bookable: false })))).toMatchObject({ count: 25, fromPriceMinor: null, minutes: { min: 60, max: 90 } })
  })
})

describe('the curve\'s reading', () => {
  it('names the peak, the spirit and the strongest mix from the curve itself', () => {
    const curve = computeCurve({ tempC: 16, sugarGL: 0, points: 201 })
    const reading = filmCurveReading(curve)!
    const peak = Math.max(...curve.map(p => p.filmActivityIndex))
    expect(reading.peak.filmActivityIndex).toBe(peak)
    expect(reading.spirit.abvPctVol).toBe(40)
    expect(reading.strongest.abvPctVol).toBe(95)
    expect(reading.bulkFirst_mN_m).toBe(curve[0]!.surfaceTensionBulk_mN_m)
    const summary = filmCurveSummary(reading, '16 °C', '50 % humidity and 20 °C')
    expect(summary).toContain(`peaks at about ${Math.round(peak)} near ${reading.peak.abvPctVol.toFixed(0)} % vol`)
    expect(filmCurveSummary(filmCurveReading([]), 'x', 'y')).toBe('')
  })
})
