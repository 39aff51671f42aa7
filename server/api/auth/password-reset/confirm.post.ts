export default defineEventHandler(async event => ({ user: await setPasswordFromLink(event, 'reset') }))
