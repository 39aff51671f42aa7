/** The sitemap of the venue's public pages (sitemaps.org protocol 0.9), for search engines. Public. */
export default defineEventHandler(async (event) => {
  const venue = await getVenue()
  const xml = sitemapXml(await sitemapEntries(venue))
  setResponseHeader(event, 'content-type', 'application/xml; charset=utf-8')
  setResponseHeader(event, 'cache-control', 'public, max-age=300')
  return xml
})
