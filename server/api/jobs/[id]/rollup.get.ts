import { uuidParam } from '../../../../shared/schemas/auth'

// The job's figures against its bid: the foreman of the job and the office. The cookie is checked
// first (401 before a bad id's 422); the membership is confirmed while the job's figures are read.
export default defineEventHandler(async (event) => {
  await signedInUser(event)
  const { id } = await paramsWith(event, uuidParam)
  return await jobRollupFor(requireMember(event, ['foreman', 'office']), id)
})
