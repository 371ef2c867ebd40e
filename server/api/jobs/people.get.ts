export default defineEventHandler(async (event) => {
  const office = await requireMember(event, ['office'])
  return await jobPeople(office.organisationId)
})
