// API errors are JSON { statusCode, message, fieldErrors? }; pages keep Nuxt's own error handling.
import type { NitroErrorHandler } from 'nitropack'
import { DATABASE_UNAVAILABLE, isDatabaseUnavailable } from './utils/db-errors'

export default <NitroErrorHandler> function (error, event) {
  if (!event.path.startsWith('/api/')) return
  const unavailable = isDatabaseUnavailable(error)
  const statusCode = unavailable ? 503 : error.statusCode && error.statusCode >= 400 ? error.statusCode : 500
  const data = (error.data ?? {}) as Record<string, unknown>
  const body: Record<string, unknown> = {
    statusCode,
    // An unexpected exception never leaks its text to the client.
    message: unavailable
      ? DATABASE_UNAVAILABLE
      : error.unhandled ? 'Something went wrong on the server. Please try again.' : error.message,
  }
  if (unavailable) setResponseHeader(event, 'Retry-After', 5)
  // Nitro adds the request path to its own 404s; the API's error shape does not carry it.
  for (const [key, value] of Object.entries(data)) if (value !== undefined && key !== 'path') body[key] = value
  if (statusCode >= 500) console.error('[api]', event.method, event.path, error.cause ?? error)
  const headers = (data.headers ?? {}) as Record<string, string>
  delete body.headers
  for (const [name, value] of Object.entries(headers)) setResponseHeader(event, name, value)
  setResponseHeader(event, 'content-type', 'application/json; charset=utf-8')
  setResponseHeader(event, 'cache-control', 'no-store')
  setResponseStatus(event, statusCode)
  return send(event, JSON.stringify(body))
}
