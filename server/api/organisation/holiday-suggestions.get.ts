import { holidaySuggestionQuery } from '../../../shared/schemas/jobs'

export default defineEventHandler(async (event) => {
  await requireMember(event, ['office'])
  const { country, state, year } = await queryWith(event, holidaySuggestionQuery)
  return { holidays: suggestedHolidays(country, state, year) }
})
