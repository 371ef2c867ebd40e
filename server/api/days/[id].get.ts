import { uuidParam } from '../../../shared/schemas/auth'

// One day in full for review: crew, drops, lifts, photos, notes and the review thread.
export default defineEventHandler(async (event) => {
  const member = await requireMember(event, ['foreman', 'office'])
  const { id } = await paramsWith(event, uuidParam)
  setResponseHeader(event, 'Cache-Control', 'no-store')
  return await reviewDayFor(member, id)
})
