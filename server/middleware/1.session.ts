// Every request with a session cookie is checked against the database (revocation, idle and absolute expiry).
export default defineEventHandler(async (event) => {
  if (event.path.startsWith('/_nuxt/') || event.path.startsWith('/__nuxt')) return
  if (!getCookie(event, sessionCookieName())) return
  try {
    event.context.currentUser = await resolveSession(event)
  }
  catch (error) {
    // Pages and API alike answer 503 while the database is away, instead of a generic 500.
    if (isDatabaseUnavailable(error)) throw createError({ statusCode: 503, statusMessage: 'Database unavailable', message: DATABASE_UNAVAILABLE })
    throw error
  }
})
