/** useFetch keys shared by the pages that show a thing and the actions that change it. */
export const productsKey = 'products'
export const productKey = (id: number) => `product-${id}`
