import { findDatingClues } from '../../../../../shared/dating'
import { datingQuerySchema } from '../../../../../shared/schemas/dating'

// What the words on a base say about when it was made (rules in shared/dating/rules.ts).
export default defineEventHandler(async (event) => {
  await requireMember(event, 'viewer')
  const { text, country } = validQuery(event, datingQuerySchema)
  return findDatingClues(text, country)
})
