import { passwordChangeBody } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  const { currentPassword, newPassword } = await readBodyWith(event, passwordChangeBody)
  await changePassword(member, currentPassword, newPassword)
  return { ok: true }
})
