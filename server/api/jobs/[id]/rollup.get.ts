import { uuidParam } from '../../../../shared/schemas/auth'

// The job's figures against its bid: the foreman of the job and the office.
export default defineEventHandler(async (event) => {
  const member = await requireMember(event, ['foreman', 'office'])
  const { id } = await paramsWith(event, uuidParam)
  return await jobRollupFor(member, id)
})
