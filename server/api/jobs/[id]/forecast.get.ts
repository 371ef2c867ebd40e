import { uuidParam } from '../../../../shared/schemas/auth'

// How far the job is built, and the crew-days and finish its rate so far leads to: the foreman of the job and the office.
export default defineEventHandler(async (event) => {
  const member = await requireMember(event, ['foreman', 'office'])
  const { id } = await paramsWith(event, uuidParam)
  return await jobForecastFor(member, id)
})
