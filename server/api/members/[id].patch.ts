import { memberPatchBody, uuidParam } from '../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const office = await requireMember(event, ['office'])
  const { id } = await paramsWith(event, uuidParam)
  const change = await readBodyWith(event, memberPatchBody)
  return { member: await updateMember(office, id, change) }
})
