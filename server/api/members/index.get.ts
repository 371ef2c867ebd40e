export default defineEventHandler(async (event) => {
  const office = await requireMember(event, ['office'])
  const [members, invitations] = await Promise.all([listMembers(office.organisationId), pendingInvitations(office.organisationId)])
  return { members, invitations }
})
