// The company's own days off, which the projected finish skips. date-holidays offers a country's or
// state's public holidays as a starting list; the office keeps, drops or adds days and saves the list.
import Holidays from 'date-holidays'
import type { Member } from './members'

export async function readHolidays(organisationId: string): Promise<{ holidays: string[], timeZone: string }> {
  const { holidays, timeZone } = await organisationCalendar(organisationId)
  return { holidays: [...holidays].sort(), timeZone }
}

export async function saveHolidays(office: Member, holidays: string[]): Promise<{ holidays: string[] }> {
  const list = [...new Set(holidays)].sort()
  await useDb().transaction(async (trx) => {
    await trx('organisations').where({ id: office.organisationId }).update({ holidays: JSON.stringify(list), updated_at: new Date() })
    await audit(trx, office, 'organisation.holidays', 'organisation', office.organisationId, { holidays: list })
  })
  return { holidays: list }
}

/** Public holidays of a country (and state) in a year, as suggestions; unknown places give 404. */
export function suggestedHolidays(country: string, state: string | undefined, year: number): { date: string, name: string }[] {
  const calendar = new Holidays()
  const known = country in calendar.getCountries() && (!state || state in (calendar.getStates(country) ?? {}))
  if (!known) throw createError({ statusCode: 404, statusMessage: 'No public holidays are known for that place' })
  calendar.init(country, state ?? '')
  const days = calendar.getHolidays(year) || []
  const seen = new Set<string>()
  return days.filter(h => h.type === 'public').map(h => ({ date: h.date.slice(0, 10), name: h.name }))
    .filter(h => !seen.has(h.date) && seen.add(h.date))
}
