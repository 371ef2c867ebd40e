import { uuidParam } from '../../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const member = await requireMember(event, ['office', 'foreman'])
  const { id } = await paramsWith(event, uuidParam)
  return { days: await jobDays(member, id) }
})
