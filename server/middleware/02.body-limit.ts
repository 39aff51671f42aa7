/** A body larger than its route accepts is refused before it is read (413); see bodyLimitFor. */
export default defineEventHandler((event) => {
  const length = Number(getRequestHeader(event, 'content-length') ?? 0)
  if (length > bodyLimitFor(event.path)) bodyTooLarge(event)
})
