import { jobsTableQuery } from '../../../shared/schemas/jobs'

export default defineEventHandler(async (event) => {
  const member = await requireMember(event, ['office', 'foreman'])
  const query = await queryWith(event, jobsTableQuery)
  return sendCsv(event, 'jobs.csv', jobsTableCsv(await jobsTable(member, query)))
})
