// The office's rates page and bid helper: the company's own rates (production-sql.ts) and what the
// pure functions make of them for a new job.
import type { Member } from './members'
import type { BidHelperBody, RatesQuery } from '../../shared/schemas/rates'
import type { RatesAnswer, BidHelperAnswer } from '../../shared/types/rates'
import { estimateCrewDays, rateRule, weatherAllowance } from '../../shared/utils/production'
import { productionStages } from '../../shared/utils/trade-data-production'
import { productionDaysOf, rateSources, ratesBySql } from './production-sql'

export async function ratesPage(member: Member, query: RatesQuery): Promise<RatesAnswer> {
  const [rates, crewLeads] = await Promise.all([
    ratesBySql(member.organisationId, query),
    useDb()('memberships as m').join('users as u', 'u.id', 'm.user_id').where({ 'm.organisation_id': member.organisationId, 'm.role': 'crew_lead' })
      .orderBy('u.name').select('u.id', 'u.name'),
  ])
  const sources = await rateSources(member.organisationId, [...new Set(rates.flatMap(r => r.daySheetIds))])
  return { rates, sources, rule: rateRule, crewLeads }
}

export async function bidHelper(member: Member, body: BidHelperBody): Promise<BidHelperAnswer> {
  const [rates, history, calendar] = await Promise.all([
    ratesBySql(member.organisationId, { crewLeadId: body.crewLeadId }),
    productionDaysOf(member.organisationId, {}),
    organisationCalendar(member.organisationId),
  ])
  const quantities = body.zones.map(z => ({ zoneKind: z.zoneKind, quantity: z.quantity, stages: z.stages }))
  const median = estimateCrewDays(quantities, rates, { percentile: 50 })
  const safe = estimateCrewDays(quantities, rates, { percentile: 80 })
  // The allowance for the crew-days at the median; the 80th percentile already carries slow days.
  const weather = weatherAllowance(history, body.startDate, median.bidCrewDays, new Set(calendar.holidays))
  // estimateCrewDays answers each zone's stages one after the other.
  let at = 0
  const perZone = body.zones.map((z) => {
    const from = at
    at += z.stages?.length ?? productionStages.length
    return { name: z.name, zoneKind: z.zoneKind, quantity: z.quantity, median: median.lines.slice(from, at), safe: safe.lines.slice(from, at) }
  })
  return { median, safe, weather, perZone, rule: rateRule, bidWithWeather: median.bidCrewDays + Math.ceil(weather.allowanceDays * 2) / 2 }
}
