import { resetPasswordBody } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { token, password } = await readBodyWith(event, resetPasswordBody)
  await resetPassword(token, password)
  return { ok: true }
})
