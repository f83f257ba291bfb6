// API errors are JSON { statusCode, message, fieldErrors? }; pages keep Nuxt's own error handling.
import type { NitroErrorHandler } from 'nitropack'

export default <NitroErrorHandler> function (error, event) {
  if (!event.path.startsWith('/api/')) return
  const statusCode = error.statusCode && error.statusCode >= 400 ? error.statusCode : 500
  const data = (error.data ?? {}) as Record<string, unknown>
  const body: Record<string, unknown> = {
    statusCode,
    // An unexpected exception never leaks its text to the client.
    message: error.unhandled
      ? 'Something went wrong on the server. Please try again.'
      : error.message,
  }
  for (const [key, value] of Object.entries(data)) if (value !== undefined) body[key] = value
  if (statusCode >= 500) console.error('[api]', event.method, event.path, error.cause ?? error)
  const headers = (data.headers ?? {}) as Record<string, string>
  delete body.headers
  for (const [name, value] of Object.entries(headers)) setResponseHeader(event, name, value)
  setResponseHeader(event, 'content-type', 'application/json; charset=utf-8')
  setResponseHeader(event, 'cache-control', 'no-store')
  setResponseStatus(event, statusCode)
  return send(event, JSON.stringify(body))
}
