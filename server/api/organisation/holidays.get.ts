export default defineEventHandler(async (event) => {
  const member = await requireMember(event, ['office', 'foreman'])
  return await readHolidays(member.organisationId)
})
