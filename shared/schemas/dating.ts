import { z } from 'zod'

export const datingQuerySchema = z.object({
  text: z.string().trim().min(1, 'Type the words on the base.').max(2000, 'At most 2,000 characters.'),
  country: z.string().trim().max(100, 'At most 100 characters.').optional(),
})
