import { uuidParam } from '../../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const member = await requireMember(event, ['office', 'foreman'])
  const { id } = await paramsWith(event, uuidParam)
  return sendCsv(event, `job-days-${id.slice(0, 8)}.csv`, jobDaysCsv(await jobDays(member, id)))
})
