/** The lightest answer the server gives (no database): a liveness probe and the benchmarks' ceiling. */
export default defineEventHandler(() => ({ ok: true }))
