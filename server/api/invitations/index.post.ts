import { inviteBody } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const office = await requireMember(event, ['office'])
  const { email, role } = await readBodyWith(event, inviteBody)
  const result = await createInvitation(event, office, email, role)
  setResponseStatus(event, 201)
  return result
})
