// The invented demo scenario: a resale team in the invented town of Hollowbrook.
import type { Role } from '../../../shared/roles'

export const DEMO_TEAM = { name: 'Hollowbrook Finds', slug: 'hollowbrook-finds', timeZone: 'America/Chicago' }

// One demo member per role. The password is for local demos only and is printed by npm start.
export const DEMO_PASSWORD = 'shelf-finds-2026'

export const DEMO_MEMBERS: { name: string, email: string, role: Role }[] = [
  { name: 'Maren Holt', email: 'maren@hollowbrook.example', role: 'owner' },
  { name: 'Theo Vance', email: 'theo@hollowbrook.example', role: 'editor' },
  { name: 'Priya Lund', email: 'priya@hollowbrook.example', role: 'contributor' },
  { name: 'Sam Okafor', email: 'sam@hollowbrook.example', role: 'viewer' },
]
