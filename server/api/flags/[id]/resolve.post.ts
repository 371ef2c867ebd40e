import { uuidParam } from '../../../../shared/schemas/auth'
import { decisionInput } from '../../../../shared/schemas/review'

export default defineEventHandler(async (event) => {
  const member = await requireMember(event, ['foreman', 'office'])
  const { id } = await paramsWith(event, uuidParam)
  const input = await readBodyWith(event, decisionInput)
  return await resolveFlag(member, id, input)
})
