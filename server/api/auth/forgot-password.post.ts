import { forgotPasswordBody } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { email } = await readBodyWith(event, forgotPasswordBody)
  await requestPasswordReset(event, email)
  // The same answer whether or not the address has an account.
  setResponseStatus(event, 202)
  return { ok: true }
})
