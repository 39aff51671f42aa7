/** A guest confirms their address with the e-mailed link and is signed in. */
export default defineEventHandler(async event => ({ user: await confirmAddressFromLink(event) }))
