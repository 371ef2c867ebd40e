import { uuidParam } from '../../../shared/schemas/auth'
import { jobUpdateBody } from '../../../shared/schemas/jobs'

export default defineEventHandler(async (event) => {
  const office = await requireMember(event, ['office'])
  const { id } = await paramsWith(event, uuidParam)
  const body = await readBodyWith(event, jobUpdateBody)
  return { job: await updateJob(office, id, body) }
})
