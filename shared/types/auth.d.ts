// The sealed session cookie holds ids and timestamps only (cookies over about 4 KB fail silently).
declare module '#auth-utils' {
  interface User {
    id: number
  }
  interface UserSession {
    /** Must equal users.session_version, or the session has been revoked. */
    version: number
    issuedAt: number
    seenAt: number
  }
}

export {}
