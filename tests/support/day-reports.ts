// Eight worked days of one company synced and approved through several app instances in turn, then
// waited for until the mail outbox has sent every day report: for the tests that count the mail.
import { randomUUID } from 'node:crypto'
import type { Knex } from 'knex'
import { addZoneAndCrew, dayWithWork } from './daybook'
import { fixturePassword, type FixtureCompany } from './fixtures'
import { sessionCookieOf } from './http'

const json = (cookie: string, extra: Record<string, string> = {}) => ({ 'content-type': 'application/json', cookie, ...extra })

async function signInOn(base: string, email: string, headers: Record<string, string>): Promise<string> {
  const response = await fetch(`${base}/api/auth/sign-in`, { method: 'POST', headers: { ...json(''), ...headers }, body: JSON.stringify({ email, password: fixturePassword }) })
  if (response.status !== 200) throw new Error(`sign-in on ${base} answered ${response.status}`)
  return sessionCookieOf(response)
}

/** The work dates reported; `headers` go with every request (an X-Forwarded-For, say). */
export async function approveDaysThrough(bases: string[], db: Knex, yard: FixtureCompany, headers: Record<string, string> = {}): Promise<string[]> {
  const { zoneId, crew } = await addZoneAndCrew(yard.organisationId, yard.jobId)
  const leads = await Promise.all(bases.map(base => signInOn(base, yard.lead.email, headers)))
  const foremen = await Promise.all(bases.map(base => signInOn(base, yard.foreman.email, headers)))
  const dates = Array.from({ length: 8 }, (_, i) => `2026-11-${String(9 + i).padStart(2, '0')}`)
  const sheets: string[] = []
  for (const [i, date] of dates.entries()) {
    const day = dayWithWork(yard.jobId, zoneId, crew, date)
    const n = i % bases.length
    const synced = await fetch(`${bases[n]}/api/sync`, { method: 'POST', headers: json(leads[n]!, { 'idempotency-key': randomUUID(), ...headers }), body: JSON.stringify({ changes: day.changes }) })
    if (synced.status !== 200) throw new Error(`a day's sync answered ${synced.status}`)
    sheets.push(day.sheetId)
  }
  // The foreman approves them through every instance in turn, as a proxy hands his requests out.
  for (const [i, sheetId] of sheets.entries()) {
    const n = i % bases.length
    const approved = await fetch(`${bases[n]}/api/days/${sheetId}/approve`, { method: 'POST', headers: json(foremen[n]!, headers), body: JSON.stringify({ note: 'Checked' }) })
    if (approved.status !== 200) throw new Error(`an approval answered ${approved.status}`)
  }
  const count = async (unsentOnly: boolean) => Number((await db('mail_outbox').whereIn('day_sheet_id', sheets).where(q => unsentOnly ? q.whereNull('sent_at') : q).count({ n: '*' }).first())?.n)
  const deadline = Date.now() + 40_000
  while ((await count(false)) < sheets.length || (await count(true)) > 0) {
    if (Date.now() > deadline) throw new Error('the day reports were not all sent')
    await new Promise(r => setTimeout(r, 200))
  }
  // A few more ticks of every timer: a second copy would arrive now.
  await new Promise(r => setTimeout(r, 3000))
  return dates
}
