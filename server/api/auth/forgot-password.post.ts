import { forgotPasswordBody } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { email } = await readBodyWith(event, forgotPasswordBody)
  askForPasswordReset(event, email)
  // The same answer, at once, whether or not the address has an account.
  setResponseStatus(event, 202)
  return { ok: true }
})
