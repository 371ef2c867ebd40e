export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  const jobs = await visibleJobs(member).orderBy('jobs.start_date', 'desc').select(
    'jobs.id', 'jobs.name', 'jobs.customer_name as customerName', 'jobs.site_address as siteAddress',
    'jobs.status', 'jobs.crew_days_bid as crewDaysBid', 'jobs.start_date as startDate',
  )
  return { jobs }
})
