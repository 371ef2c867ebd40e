import { jobCreateBody } from '../../../shared/schemas/jobs'

export default defineEventHandler(async (event) => {
  const office = await requireMember(event, ['office'])
  const body = await readBodyWith(event, jobCreateBody)
  const { status, job } = await createJob(office, body)
  setResponseStatus(event, status)
  return { job }
})
