// Every request with a session cookie is checked against the database (revocation, idle and absolute expiry).
export default defineEventHandler(async (event) => {
  if (event.path.startsWith('/_nuxt/') || event.path.startsWith('/__nuxt')) return
  if (!getCookie(event, sessionCookieName(event))) return
  event.context.currentUser = await resolveSession(event)
})
