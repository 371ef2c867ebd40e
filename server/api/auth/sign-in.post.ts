import { signInBody } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { email, password, organisationId } = await readBodyWith(event, signInBody)
  return { user: await signIn(event, email, password, organisationId) }
})
