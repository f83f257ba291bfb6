// CSRF defence (OWASP ASVS 5.0 V3): a state-changing API request must come from the app's own origin.
// Browsers send Origin on cross-site POST/PATCH/DELETE and Sec-Fetch-Site everywhere modern; tools
// without either (scripts, tests) carry no ambient cookies of a victim and are let through.
const SAFE = new Set(['GET', 'HEAD', 'OPTIONS'])

export default defineEventHandler((event) => {
  if (SAFE.has(event.method) || !event.path.startsWith('/api/')) return
  const site = getRequestHeader(event, 'sec-fetch-site')
  if (site && site !== 'same-origin' && site !== 'none') throw httpError(403, 'Cross-site requests are refused.')
  const origin = getRequestHeader(event, 'origin')
  if (!origin) return
  const host = getRequestHeader(event, 'x-forwarded-host') && process.env.TRUST_PROXY === '1'
    ? getRequestHeader(event, 'x-forwarded-host')
    : getRequestHeader(event, 'host')
  let originHost: string
  try {
    originHost = new URL(origin).host
  }
  catch {
    throw httpError(403, 'Cross-site requests are refused.')
  }
  if (originHost !== host && origin !== useServerConfig().publicUrl) throw httpError(403, 'Cross-site requests are refused.')
})
