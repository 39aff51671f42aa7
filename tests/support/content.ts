import { expect } from 'vitest'
import sharp from 'sharp'
import type { Client } from './http'
import { signedIn } from './people'

/** Invented products for a flight whose notes, introduction and photo tests publish (no real brand). */
const PRODUCTS = [
  { kind: 'cider', name: 'Quillbank Perry', abv: 5.5, sugar: 9, temp: 8, ml: 90 },
  { kind: 'sparkling', name: 'Sandpiper Crémant', abv: 12, sugar: 7, temp: 7, ml: 60 },
  { kind: 'still_wine', name: 'Eelgrass Chenin', abv: 12.5, sugar: 4, temp: 10, ml: 60 },
  { kind: 'still_wine', name: 'Peat Bank Grenache', abv: 14, sugar: 2, temp: 16, ml: 60 },
  { kind: 'fortified', name: 'Hightide Ruby', abv: 19.5, sugar: 95, temp: 16, ml: 45 },
  { kind: 'spirit', name: 'Bellbuoy Aquavit', abv: 42, sugar: 0, temp: 18, ml: 15 },
] as const

/** What marketing writes: an introduction, and a note on every pour (lists and bold among them). */
export const CONTENT = {
  intro: 'A walk along the **tide line**, from orchard fruit to the still.\n\nTake each pour _slowly_ and watch the glass.',
  notes: [
    'Quince and **sea salt**, then:\n\n- lemon zest\n- a **chalky** finish',
    'Fine bubbles over **toasted** almond.',
    'Green pear with a _honeyed_ edge.',
    'Bramble and **warm** clay.',
    '1. Dark cherry\n2. **Cocoa** and dried fig',
    'Caraway, dill and a **clean** finish.',
  ],
  photoAlt: 'A tall green bottle of perry on a linen cloth',
}

export interface ContentFlight { flightId: number, productIds: number[], photo: { src: string, width: number, height: number }, names: string[] }

/**
 * A published six-pour flight of its own products, with marketing's introduction and a note on
 * every product published and a photo of the first product uploaded, as guests and cards see it.
 */
export async function flightWithContent(tag: string): Promise<ContentFlight> {
  const manager = await signedIn('manager')
  const marketing = await signedIn('marketing')
  const glass = ((await manager.get('/api/glasses')).body as { id: number }[])[0]!.id
  const productIds: number[] = []
  for (const [i, p] of PRODUCTS.entries()) {
    const res = await manager.post('/api/products', {
      code: `${tag}-${i}-${Date.now() % 100000}`, kind: p.kind, name: p.name, producer: 'Invented Cellars', vintageOrBatch: '2025', servingTempC: p.temp,
      allergens: p.kind === 'spirit' ? [] : ['sulfites'], bottleSizeMl: 750, costPerBottleMinor: 1000,
      measurement: { abvPctVol: p.abv, residualSugarGL: p.sugar, lab: 'Test lab', method: 'Test method', measuredOn: '2026-10-01' },
    })
    expect(res.status, JSON.stringify(res.body)).toBe(201)
    productIds.push(res.body.id)
  }
  const flight = await manager.post('/api/flights', { name: `Tide line flight ${tag}`, summary: 'Six invented pours', pours: PRODUCTS.map((p, i) => ({ productId: productIds[i], volumeMl: p.ml, glassId: glass, servingTempC: p.temp })) })
  expect(flight.status, JSON.stringify(flight.body)).toBe(201)
  const flightId = flight.body.id as number
  expect((await manager.post(`/api/flights/${flightId}/publish`)).status).toBe(200)

  await publish(marketing, `/api/content/flight_intro/${flightId}`, CONTENT.intro)
  for (const [i, id] of productIds.entries()) await publish(marketing, `/api/content/product_note/${id}`, CONTENT.notes[i]!)
  const photo = await uploadPhoto(marketing, productIds[0]!, CONTENT.photoAlt)
  return { flightId, productIds, photo, names: PRODUCTS.map(p => p.name) }
}

async function publish(c: Client, path: string, body: string) {
  expect((await c.request('PUT', path, { body })).status).toBe(200)
  const res = await c.post(`${path}/publish`)
  expect(res.status).toBe(200)
  expect(res.body.status).toBe('published')
}

/** A portrait photo (a drawn bottle), uploaded as marketing does it. */
async function uploadPhoto(c: Client, productId: number, altText: string) {
  const svg = '<svg xmlns="http://www.w3.org/2000/svg" width="600" height="900"><rect width="600" height="900" fill="#efe6d6"/><rect x="240" y="120" width="120" height="700" rx="40" fill="#25665f"/><rect x="255" y="420" width="90" height="160" fill="#faf7f1"/></svg>'
  const png = await sharp(Buffer.from(svg)).png().toBuffer()
  const form = new FormData()
  form.append('file', new Blob([new Uint8Array(png)]), 'perry.png')
  form.append('productId', String(productId))
  form.append('role', 'photo')
  form.append('altText', altText)
  const res = await c.request('POST', '/api/images', form)
  expect(res.status, JSON.stringify(res.body)).toBe(201)
  return res.body as { src: string, width: number, height: number }
}
