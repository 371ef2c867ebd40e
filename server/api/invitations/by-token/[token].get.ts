import { tokenParam } from '../../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { token } = await paramsWith(event, tokenParam)
  const { email, role, organisationName } = await invitationByToken(token)
  return { email, role, organisationName }
})
