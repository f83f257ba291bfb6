// In production (NODE_ENV=production behind an https PUBLIC_URL): HSTS, and a Secure, __Host- prefixed
// session cookie. Decided per request from the environment, so one build serves local runs and production.
// nuxt-auth-utils reads its session settings from the runtime config of the first request that uses a
// session (useRuntimeConfig(event), this request's own copy) and keeps them: requests get the production
// settings until then. Only until then: that per-request copy costs about 3 ms of CPU.
export default defineEventHandler((event) => {
  if (!useServerConfig().production) return
  setResponseHeader(event, 'Strict-Transport-Security', 'max-age=31536000; includeSubDomains')
  if (sessionSettingsTaken()) return
  const session = useRuntimeConfig(event).session as { name?: string, cookie?: Record<string, unknown> }
  session.name = PRODUCTION_SESSION_COOKIE
  session.cookie = { ...session.cookie, secure: true, path: '/', sameSite: 'lax', httpOnly: true }
})
