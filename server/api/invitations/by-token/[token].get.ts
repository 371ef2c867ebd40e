import { tokenParam } from '../../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { token } = await paramsWith(event, tokenParam)
  return await invitationPreview(token)
})
