import { acceptRequestBody } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const body = await readBodyWith(event, acceptRequestBody)
  const { userId, organisationId } = await acceptInvitation(event, body)
  const account = await findAccount({ id: userId }, organisationId)
  if (!account) throw createError({ statusCode: 500, statusMessage: 'The new account could not be read back' })
  return { user: await startSession(event, account) }
})
