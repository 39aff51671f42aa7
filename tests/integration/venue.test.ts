import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Client } from '../support/http'
import { Client as Anonymous } from '../support/http'
import { signedIn } from '../support/people'

/**
 * The venue's settings through PATCH /api/venue: contact details, opening hours, locale, currency
 * and zone are checked by the form's own schema; a bad field answers 400 with its message and
 * writes nothing; good ones come back from GET and reach the footer of the public pages.
 */
let manager: Client
let original: Record<string, unknown>

beforeAll(async () => {
  manager = await signedIn('manager')
  const { id: _id, ...settings } = (await manager.get('/api/venue')).body
  original = settings
})

// Other tests read the demo venue's settings: put them back.
afterAll(async () => {
  expect((await manager.patch('/api/venue', original)).status).toBe(200)
})

async function settings(): Promise<Record<string, unknown>> {
  return (await manager.get('/api/venue')).body
}

/** [what is wrong, the body's field, its value, the field the 400 names, its message]. */
const BAD: [string, string, unknown, string, RegExp][] = [
  ['a phone number in words', 'phone', 'call the bar', 'phone', /digits, spaces/],
  ['a phone number too short', 'phone', '555 1', 'phone', /6 to 40 characters/],
  ['a phone number too long', 'phone', '1'.repeat(41), 'phone', /6 to 40 characters/],
  ['a + inside a phone number', 'phone', '207 +555 0143', 'phone', /\+ only first/],
  ['a phone number of brackets', 'phone', '(( - ))', 'phone', /at least 6 digits/],
  ['an e-mail without a domain', 'email', 'hello@', 'email', /e-mail address like/],
  ['an e-mail with a space', 'email', 'hello there@saltmarsh.test', 'email', /e-mail address like/],
  ['a web site without its scheme', 'website', 'saltmarsh.test', 'website', /starting with https:\/\//],
  ['a script address as web site', 'website', 'javascript:alert(1)', 'website', /starting with https:\/\//],
  ['an ftp address as web site', 'website', 'ftp://saltmarsh.test', 'website', /starting with https:\/\//],
  ['a locale the app does not offer', 'locale', 'fr-FR', 'locale', /languages and regions offered/],
  ['a bare language as locale', 'locale', 'en', 'locale', /languages and regions offered/],
  ['an unknown currency code (the platform formats any three letters)', 'currency', 'XYZ', 'currency', /currency from the list/],
  ['a withdrawn currency', 'currency', 'DEM', 'currency', /currency from the list/], // Deutsche Mark, withdrawn 2002 (ISO 4217 list of historic codes, from memory)
  ['a zone the platform accepts but does not list', 'timeZone', 'SystemV/EST5', 'timeZone', /time zone from the list/], // an old System V name, not in the IANA database (from memory)
  ['a fixed-offset zone', 'timeZone', 'Etc/GMT+5', 'timeZone', /time zone from the list/], // its sign reads backwards: UTC-05:00 (IANA etcetera file, from memory)
  ['closing before opening', 'openingHours', { mon: [{ opens: '18:00', closes: '12:00' }] }, 'openingHours.mon.0.closes', /after opening/],
  ['closing at opening', 'openingHours', { mon: [{ opens: '12:00', closes: '12:00' }] }, 'openingHours.mon.0.closes', /after opening/],
  ['a time without its leading zero', 'openingHours', { tue: [{ opens: '9:30', closes: '12:00' }] }, 'openingHours.tue.0.opens', /like 09:30/],
  ['an hour past 23', 'openingHours', { wed: [{ opens: '10:00', closes: '24:30' }] }, 'openingHours.wed.0.closes', /like 09:30/],
  ['a missing closing time', 'openingHours', { thu: [{ opens: '10:00' }] }, 'openingHours.thu.0.closes', /closing time/],
  ['two openings that overlap', 'openingHours', { fri: [{ opens: '12:00', closes: '16:00' }, { opens: '15:30', closes: '20:00' }] }, 'openingHours.fri.1.opens', /overlaps 12:00–16:00/],
  ['an opening inside another', 'openingHours', { sat: [{ opens: '10:00', closes: '22:00' }, { opens: '12:00', closes: '13:00' }] }, 'openingHours.sat.1.opens', /overlaps 10:00–22:00/],
  ['five openings in a day', 'openingHours', { sun: ['08', '10', '12', '14', '16'].map(h => ({ opens: `${h}:00`, closes: `${h}:30` })) }, 'openingHours.sun', /at most 4/],
  ['a day that is not a list', 'openingHours', { mon: '12:00-18:00' }, 'openingHours.mon', /as a list/],
  ['hours that are not per day', 'openingHours', 'always open', 'openingHours', /per day of the week/],
  ['a room humidity over 100 %', 'roomHumidityPct', 130, 'roomHumidityPct', /whole number from 0 to 100 %/],
  ['a room air temperature past the model\'s range, in the demo\'s °F', 'roomAirTempC', 55, 'roomAirTempC', /between 32 and 104 °F/],
  ['a country code that names no country', 'country', 'QQ', 'country', /country from the list/], // QQ is user-assigned, not a country (ISO 3166-1, from memory)
  ['a country given by its name', 'country', 'Portugal', 'country', /country from the list/],
  ['a paper the cards do not print on', 'cardPaper', 'a4', 'cardPaper', /A5, US half letter/],
]

describe('venue settings: each bad field', () => {
  it.each(BAD)('%s: 400 with its message, nothing changed', async (_what, field, value, key, message) => {
    const before = await settings()
    const res = await manager.patch('/api/venue', { ...original, [field]: value })
    expect(res.status, JSON.stringify(res.body)).toBe(400)
    expect(Object.keys(res.body.data.fields)).toEqual([key])
    expect(res.body.data.fields[key]).toMatch(message)
    expect(await settings()).toEqual(before)
  })

  it('a body with several bad fields names each one and still writes nothing', async () => {
    const before = await settings()
    const res = await manager.patch('/api/venue', { ...original, phone: 'x', email: 'y', website: 'z', currency: 'ABC', timeZone: 'Nowhere', locale: 'xx' })
    expect(res.status).toBe(400)
    expect(Object.keys(res.body.data.fields).sort()).toEqual(['currency', 'email', 'locale', 'phone', 'timeZone', 'website'])
    expect(await settings()).toEqual(before)
  })
})

describe('venue settings: the cards\' paper', () => {
  it('follows the country (half letter in the US and Canada, A5 in Portugal) until the manager chooses one', async () => {
    const paperOf = async () => (await manager.get(`/api/flights/${((await manager.get('/api/flights')).body as { id: number, status: string }[]).find(f => f.status === 'published')!.id}/card`)).body.paper
    // US letter-size paper is the office standard in the US and Canada; Portugal uses ISO 216 (from memory).
    for (const [country, paper] of [['US', 'half-letter'], ['CA', 'half-letter'], ['pt', 'a5']] as const) {
      expect((await manager.patch('/api/venue', { ...original, country, cardPaper: null })).status).toBe(200)
      expect((await settings()).country).toBe(country.toUpperCase())
      expect(await paperOf(), country).toBe(paper)
    }
    expect((await manager.patch('/api/venue', { ...original, country: 'PT', cardPaper: 'half-letter' })).status).toBe(200)
    expect(await paperOf()).toBe('half-letter')
  })
})

describe('venue settings: good contact details and hours', () => {
  // 020 7946 0000–0999 is set aside for drama by Ofcom (from memory); .test is reserved (RFC 2606).
  const contact = { phone: '+44 (0)20 7946 0321', email: 'Bookings@Saltmarsh.test', website: 'https://saltmarsh.test/visit', locale: 'en-GB' }
  const hours = {
    mon: [],
    tue: [{ opens: '17:00', closes: '21:00' }, { opens: '11:30', closes: '14:30' }],
    sat: [{ opens: '10:00', closes: '22:00' }],
  }

  it('round-trip: stored as given, the e-mail in lower case, closed days dropped and openings in order', async () => {
    const res = await manager.patch('/api/venue', { ...original, ...contact, openingHours: hours, currency: 'gbp', timeZone: 'Europe/London' })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    const expected = {
      ...contact,
      email: 'bookings@saltmarsh.test',
      currency: 'GBP',
      timeZone: 'Europe/London',
      openingHours: { tue: [{ opens: '11:30', closes: '14:30' }, { opens: '17:00', closes: '21:00' }], sat: [{ opens: '10:00', closes: '22:00' }] },
    }
    expect(res.body).toMatchObject(expected)
    expect(await settings()).toMatchObject(expected)
  })

  it('the footer of the home page shows the new phone, e-mail, web site and hours, in the venue\'s locale', async () => {
    expect((await manager.patch('/api/venue', { ...original, ...contact, openingHours: hours })).status).toBe(200)
    const res = await new Anonymous().send('GET', '/')
    expect(res.status).toBe(200)
    const html = await res.text()
    const footer = html.slice(html.indexOf('<footer'), html.indexOf('</footer>'))
    expect(footer).toContain('+44 (0)20 7946 0321')
    expect(footer).toContain('href="tel:+442079460321"') // the (0) trunk prefix stays out of an international number (ITU-T E.123, from memory)
    expect(footer).toContain('href="mailto:bookings@saltmarsh.test"')
    expect(footer).toContain('href="https://saltmarsh.test/visit"')
    // en-GB writes a 24-hour clock (common practice, no source); the days the venue is closed are left out.
    expect(footer).toMatch(/<dt>Tue<\/dt><dd>11:30 – 14:30, 17:00 – 21:00<\/dd>/)
    expect(footer).toMatch(/<dt>Sat<\/dt><dd>10:00 – 22:00<\/dd>/)
    expect(footer).not.toMatch(/<dt>(Mon|Thu|Fri|Sun)<\/dt>/)
  })

  it('empty contact details and no hours are accepted, and the footer then shows none', async () => {
    const res = await manager.patch('/api/venue', { ...original, phone: '', email: '', website: '', openingHours: null })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    expect(await settings()).toMatchObject({ phone: '', email: '', website: '', openingHours: null })
    const html = await (await new Anonymous().send('GET', '/')).text()
    const footer = html.slice(html.indexOf('<footer'), html.indexOf('</footer>'))
    expect(footer).not.toContain('href="tel:')
    expect(footer).not.toContain('href="mailto:')
    expect(footer).not.toContain('Opening hours')
  })

  it('a week of closed days is stored as no hours', async () => {
    const res = await manager.patch('/api/venue', { ...original, openingHours: { mon: [], tue: [] } })
    expect(res.status).toBe(200)
    expect(res.body.openingHours).toBeNull()
  })

  it('a zone\'s other IANA name is stored as the platform\'s own, a known zone in any case too', async () => {
    // US/Eastern links to America/New_York in the IANA "backward" file (from memory).
    expect((await manager.patch('/api/venue', { ...original, timeZone: 'US/Eastern' })).body.timeZone).toBe('America/New_York')
    expect((await manager.patch('/api/venue', { ...original, timeZone: 'europe/lisbon' })).body.timeZone).toBe('Europe/Lisbon')
  })

  it('the venue\'s own cautions may be empty: the fixed block is printed anyway', async () => {
    const res = await manager.patch('/api/venue', { ...original, cautions: '' })
    expect(res.status, JSON.stringify(res.body)).toBe(200)
    const html = await (await new Anonymous().send('GET', '/')).text()
    expect(html).toContain('If you are driving, please do not drink.')
  })
})
