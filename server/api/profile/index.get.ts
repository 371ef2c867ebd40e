export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  return await profileOf(member)
})
