import { jobsTableQuery } from '../../../shared/schemas/jobs'

export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  // The crew lead's phone lists the jobs they lead; the bid figures are for the office and foremen.
  if (member.role === 'crew_lead') return { jobs: await crewLeadJobs(member) }
  return { jobs: await jobsTable(member, await queryWith(event, jobsTableQuery)) }
})
