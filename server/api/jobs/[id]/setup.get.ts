import { uuidParam } from '../../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const office = await requireMember(event, ['office'])
  const { id } = await paramsWith(event, uuidParam)
  return { job: await jobSetup(office, id) }
})
