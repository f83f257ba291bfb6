// One way to call the API from pages: errors arrive as { statusCode, message, fieldErrors }.
import { FetchError } from 'ofetch'

export interface ApiProblem {
  statusCode: number
  message: string
  fieldErrors: Record<string, string[]>
  data: Record<string, unknown>
}

export function toApiProblem(error: unknown): ApiProblem {
  if (error instanceof FetchError) {
    const data = (error.data ?? {}) as Record<string, unknown>
    return {
      statusCode: error.statusCode ?? 0,
      message: typeof data.message === 'string' ? data.message : navigator?.onLine === false ? 'You are offline.' : 'The server could not be reached. Try again.',
      fieldErrors: (data.fieldErrors ?? {}) as Record<string, string[]>,
      data,
    }
  }
  return { statusCode: 0, message: error instanceof Error ? error.message : 'Something went wrong.', fieldErrors: {}, data: {} }
}

type ApiMethod = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE'

/**
 * $fetch without Nitro's route-type inference (which exhausts the type checker on template URLs).
 * Responses are typed by the caller from shared/types.
 */
export function apiFetch<T = unknown>(url: string, options: { method?: ApiMethod, body?: unknown, query?: Record<string, unknown>, signal?: AbortSignal, headers?: Record<string, string> } = {}): Promise<T> {
  return ($fetch as unknown as (u: string, o: object) => Promise<T>)(url, options)
}

/** Form state for one submit action: pending flag, the server's message and field errors. */
export function useFormSubmit<T>(action: () => Promise<T>) {
  const pending = ref(false)
  const problem = ref<ApiProblem | null>(null)
  const fieldError = (field: string) => problem.value?.fieldErrors?.[field]?.[0]
  async function submit(): Promise<T | undefined> {
    if (pending.value) return
    pending.value = true
    problem.value = null
    try {
      return await action()
    }
    catch (error) {
      problem.value = toApiProblem(error)
      return undefined
    }
    finally {
      pending.value = false
    }
  }
  return { pending, problem, fieldError, submit }
}
