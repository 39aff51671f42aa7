/** Every route the server has (Nitro's pattern, `/api/bookings/:id`) → the methods it answers; see nuxt.config.ts. */
declare module '#larmoir/route-methods' {
  const methods: Record<string, string[]>
  export default methods
}
