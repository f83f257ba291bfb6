import { loginSchema } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { email, password } = await validBody(event, loginSchema)
  return { user: await signIn(event, email, password) }
})
