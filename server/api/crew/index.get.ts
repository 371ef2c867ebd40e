export default defineEventHandler(async (event) => {
  const office = await requireMember(event, ['office'])
  return { crew: await listCrew(office.organisationId) }
})
