import { uuidParam } from '../../../shared/schemas/auth'
import { crewMemberPatchBody } from '../../../shared/schemas/crew'

export default defineEventHandler(async (event) => {
  const office = await requireMember(event, ['office'])
  const { id } = await paramsWith(event, uuidParam)
  const change = await readBodyWith(event, crewMemberPatchBody)
  return { member: await updateCrewMember(office, id, change) }
})
