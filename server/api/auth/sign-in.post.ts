import { signInBody } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { email, password } = await readBodyWith(event, signInBody)
  return { user: await signIn(event, email, password) }
})
