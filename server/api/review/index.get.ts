// The foreman's night list: days waiting for review across their jobs (or, with ?state=approved, the
// days approved, to reopen one), newest first, with counts per job.
import { reviewListQuery } from '../../../shared/schemas/review'

export default defineEventHandler(async (event) => {
  const member = await requireMember(event, ['foreman', 'office'])
  const { state } = await queryWith(event, reviewListQuery)
  setResponseHeader(event, 'Cache-Control', 'no-store')
  return await reviewListFor(member, state)
})
