import { holidaysBody } from '../../../shared/schemas/jobs'

export default defineEventHandler(async (event) => {
  const office = await requireMember(event, ['office'])
  const { holidays } = await readBodyWith(event, holidaysBody)
  return await saveHolidays(office, holidays)
})
