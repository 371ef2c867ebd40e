import { flagInput } from '../../../shared/schemas/review'

// The foreman flags one record of a day (or the day itself) with a reason and a note.
export default defineEventHandler(async (event) => {
  const member = await requireMember(event, ['foreman', 'office'])
  const input = await readBodyWith(event, flagInput)
  const flag = await flagRecord(member, input)
  setResponseStatus(event, 201)
  return flag
})
