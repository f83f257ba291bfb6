// In production (NODE_ENV=production behind an https PUBLIC_URL): HSTS, and a Secure, __Host- prefixed
// session cookie. Decided per request from the environment, so one build serves local runs and production.
// useRuntimeConfig(event) is this request's own copy; nuxt-auth-utils reads its session settings from it.
export default defineEventHandler((event) => {
  if (!useServerConfig().production) return
  const session = useRuntimeConfig(event).session as { name?: string, cookie?: Record<string, unknown> }
  session.name = '__Host-tallymark-session'
  session.cookie = { ...session.cookie, secure: true, path: '/', sameSite: 'lax', httpOnly: true }
  setResponseHeader(event, 'Strict-Transport-Security', 'max-age=31536000; includeSubDomains')
})
