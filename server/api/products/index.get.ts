import { productListQuerySchema } from '../../../shared/schemas/products'

/**
 * A page of the venue's products with their current measurement and derived figures (staff only),
 * filtered, searched and sorted by the query; the cost is shown to managers only.
 */
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'manager', 'host', 'marketing')
  const query = await readQueryAs(event, productListQuerySchema)
  return listProducts(await getVenue(), query, user.role)
})
