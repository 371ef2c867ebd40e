import { acceptInvitationBody } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const { token, name, password } = await readBodyWith(event, acceptInvitationBody)
  const userId = await acceptInvitation(token, name, password)
  const account = await findAccount({ id: userId })
  if (!account) throw createError({ statusCode: 500, statusMessage: 'The new account could not be read back' })
  return { user: await startSession(event, account) }
})
