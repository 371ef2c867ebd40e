import { uuidParam } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  const { id } = await paramsWith(event, uuidParam)
  const job = await requireVisibleJob(member, id)
  return {
    job: {
      id: job.id, name: job.name, customerName: job.customer_name, siteAddress: job.site_address, status: job.status,
      crewDaysBid: job.crew_days_bid, crewSize: job.crew_size, personHoursBid: job.person_hours_bid, startDate: job.start_date,
    },
  }
})
