export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  // Never cached: the phone must see flags and edits made since its last visit.
  setResponseHeader(event, 'Cache-Control', 'no-store')
  return await snapshotFor(member)
})
