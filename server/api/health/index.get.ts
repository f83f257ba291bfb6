import { sql } from 'drizzle-orm'

// Liveness and database reachability, for the scripts and load balancers.
export default defineEventHandler(async (event) => {
  try {
    await useDb().execute(sql`select 1`)
    return { ok: true, database: 'up' }
  }
  catch {
    setResponseStatus(event, 503)
    return { ok: false, database: 'down' }
  }
})
