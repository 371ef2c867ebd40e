import { bidHelperBody } from '../../../shared/schemas/rates'

// A new job's crew-days from the company's rates and weather history: the office only. Writes nothing.
export default defineEventHandler(async (event) => {
  const member = await requireMember(event, ['office'])
  return await bidHelper(member, await readBodyWith(event, bidHelperBody))
})
