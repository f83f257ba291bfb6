// Fixed-window counters per key (an account, an address). In memory: each app instance throttles on its own.
interface Window { count: number, resetAt: number }
const windows = new Map<string, Window>()

export interface ThrottleRule { key: string, limit: number, windowSeconds: number }

function sweep(now: number) {
  if (windows.size < 10_000) return
  for (const [key, w] of windows) if (w.resetAt <= now) windows.delete(key)
}

/** Throws 429 with Retry-After when any rule's window is already full. */
export function assertNotThrottled(rules: ThrottleRule[], message = 'Too many attempts. Wait a little and try again.') {
  const now = Date.now()
  for (const rule of rules) {
    const w = windows.get(rule.key)
    if (w && w.resetAt > now && w.count >= rule.limit) {
      const retryAfter = Math.max(1, Math.ceil((w.resetAt - now) / 1000))
      throw httpError(429, message, undefined, { retryAfter, headers: { 'Retry-After': String(retryAfter) } })
    }
  }
}

export function countAttempt(rules: ThrottleRule[]) {
  const now = Date.now()
  sweep(now)
  for (const rule of rules) {
    const w = windows.get(rule.key)
    if (!w || w.resetAt <= now) windows.set(rule.key, { count: 1, resetAt: now + rule.windowSeconds * 1000 })
    else w.count++
  }
}

export function clearAttempts(keys: string[]) {
  for (const key of keys) windows.delete(key)
}
