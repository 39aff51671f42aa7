/** A body larger than its route accepts is refused with 413 as soon as it passes the limit; see readBodyWithinLimit. */
export default defineEventHandler(event => readBodyWithinLimit(event))
