// The foreman's night list: days waiting for review across their jobs, newest first, with counts per job.
export default defineEventHandler(async (event) => {
  const member = await requireMember(event, ['foreman', 'office'])
  setResponseHeader(event, 'Cache-Control', 'no-store')
  return await reviewListFor(member)
})
