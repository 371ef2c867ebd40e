import { ratesQuery } from '../../../shared/schemas/rates'

// The company's production rates by zone kind and stage: the office only.
export default defineEventHandler(async (event) => {
  const member = await requireMember(event, ['office'])
  return await ratesPage(member, await queryWith(event, ratesQuery))
})
