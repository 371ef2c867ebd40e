import { uuidParam } from '../../../../shared/schemas/auth'

// The job's figures against its bid: the foreman of the job and the office. The cookie is checked
// first (401 before a bad id's 422); the membership is confirmed while the job's figures are read
// under the role the cookie names, and nothing is answered before it is.
export default defineEventHandler(async (event) => {
  const signedIn = await signedInUser(event)
  const { id } = await paramsWith(event, uuidParam)
  const { user } = await getUserSession(event)
  const claimed = user ? { ...signedIn, role: user.role, membershipId: '', name: '' } : undefined
  return await jobRollupFor(requireMember(event, ['foreman', 'office']), claimed, id)
})
