import { computeFilm, describePour, DEFAULT_WALL_ANGLE_DEG } from '../../../shared/science'
import { drinkKindOf } from '../../../shared/pours'
import { liquidColourOf } from '../../../shared/liquidColours'
import { productsQuerySchema } from '../../../shared/schemas/science'
import type { ProductOnCurve } from '../../../shared/types/science'

/**
 * The products the public page that explains the effect shows (`glassPageProducts`: those poured
 * in published flights, at most GLASS_PAGE_PRODUCTS_MAX, shared/products.ts) as the glass model sees them at their
 * serving temperature, in the venue's usual room air. Only what a label or a
 * menu shows is public. It reads no query; any key is refused.
 */
export default defineEventHandler(async (event): Promise<ProductOnCurve[]> => {
  await readQueryAs(event, productsQuerySchema)
  const venue = await getVenue()
  const room = venueRoom(venue).air
  const products = await glassPageProducts(venue.id)
  return products.map((p) => {
    const film = computeFilm({ abvPctVol: p.current.abvPctVol, tempC: p.servingTempC, sugarGL: p.current.residualSugarGL, wallAngleDeg: DEFAULT_WALL_ANGLE_DEG, room, kind: drinkKindOf(p.kind) })
    return {
      id: p.id,
      name: p.name,
      kind: p.kind,
      producer: p.producer,
      vintageOrBatch: p.vintageOrBatch,
      colour: liquidColourOf(p),
      abvPctVol: p.current.abvPctVol,
      residualSugarGL: p.current.residualSugarGL,
      servingTempC: p.servingTempC,
      filmActivityIndex: film.filmActivityIndex,
      predictions: film.predictions,
      viscosity_mPa_s: film.viscosity_mPa_s,
      description: describePour(film, { temperatureUnit: venue.temperatureUnit === 'f' ? 'F' : 'C' }),
    }
  }).sort((a, b) => a.abvPctVol - b.abvPctVol)
})
