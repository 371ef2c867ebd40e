import { payrollQuery } from '../../../shared/schemas/jobs'

export default defineEventHandler(async (event) => {
  const office = await requireMember(event, ['office'])
  const { from, to } = await queryWith(event, payrollQuery)
  return sendCsv(event, `payroll-${from}-to-${to}.csv`, await payrollCsv(office.organisationId, from, to))
})
