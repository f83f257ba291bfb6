import type { H3Event } from 'h3'
import type { z } from 'zod'

export type FieldErrors = Record<string, string[]>

// Errors travel as { statusCode, message, fieldErrors? } (shaped in server/error-handler.ts).
export function httpError(statusCode: number, message: string, fieldErrors?: FieldErrors, extra?: Record<string, unknown>) {
  return createError({ statusCode, message, statusMessage: undefined, data: { fieldErrors, ...extra } })
}

export const notFound = (what = 'Not found.') => httpError(404, what)
export const forbidden = (why = 'Your role in this team does not allow this.') => httpError(403, why)
export const unauthorized = () => httpError(401, 'Sign in to continue.')

export function zodFieldErrors(error: z.ZodError): FieldErrors {
  const fieldErrors: FieldErrors = {}
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.join('.') : '_'
    ;(fieldErrors[key] ??= []).push(issue.message)
  }
  return fieldErrors
}

function fromZod(error: z.ZodError, what: string) {
  const fieldErrors = zodFieldErrors(error)
  const first = Object.entries(fieldErrors)[0]
  const detail = first ? (first[0] === '_' ? first[1][0] : `${first[0]}: ${first[1][0]}`) : 'invalid'
  return httpError(400, `Please check the ${what}: ${detail}`, fieldErrors)
}

/** Reads and validates a JSON body; bad JSON and bad fields are 400s with field errors, never 500s. */
export async function validBody<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.infer<S>> {
  let raw: unknown
  try {
    raw = await readBody(event)
  }
  catch {
    throw httpError(400, 'The request body is not valid JSON.')
  }
  const result = schema.safeParse(raw ?? {})
  if (!result.success) throw fromZod(result.error, 'form')
  return result.data
}

export function validQuery<S extends z.ZodType>(event: H3Event, schema: S): z.infer<S> {
  const result = schema.safeParse(getQuery(event))
  if (!result.success) throw fromZod(result.error, 'query')
  return result.data
}

export function validParams<S extends z.ZodType>(event: H3Event, schema: S): z.infer<S> {
  const result = schema.safeParse(getRouterParams(event, { decode: true }))
  if (!result.success) throw notFound()
  return result.data
}
