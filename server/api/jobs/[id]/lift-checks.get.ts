import { uuidParam } from '../../../../shared/schemas/auth'

// Every lift of the job with its checks re-computed on the server: the foreman of the job and the office.
export default defineEventHandler(async (event) => {
  const member = await requireMember(event, ['foreman', 'office'])
  const { id } = await paramsWith(event, uuidParam)
  await requireVisibleJob(member, id)
  return { lifts: await liftChecksForJob(id) }
})
