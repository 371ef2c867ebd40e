import { profilePatchBody } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  const change = await readBodyWith(event, profilePatchBody)
  return { profile: await updateProfile(event, member, change) }
})
