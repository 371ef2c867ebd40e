import { crewMemberBody } from '../../../shared/schemas/crew'

export default defineEventHandler(async (event) => {
  const office = await requireMember(event, ['office'])
  const body = await readBodyWith(event, crewMemberBody)
  setResponseStatus(event, 201)
  return { member: await addCrewMember(office, body) }
})
