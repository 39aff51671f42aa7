/** An invited staff member sets a password with the one-time link and is signed in. */
export default defineEventHandler(async event => ({ user: await setPasswordFromLink(event, 'invite') }))
