// The rates page's query, timed for `npm run bench:rollup` on its 500 jobs × 60 days: every worked day
// gets a quantity built (one stage a day, in turn), then GET /api/rates is asked as the office.
// Figures only: nothing here passes or fails.
import { randomUUID } from 'node:crypto'
import type { Knex } from 'knex'
import { productionStages } from '../../shared/utils/trade-data-production'
import { median, signIn, timed } from './harness'
import { benchPassword } from './seed'

const rounds = 40

/** The server's own time for the rates route (its Server-Timing), median of `rounds`; and the client's. */
export async function timeRates(db: Knex, url: string, company: { organisationId: string }): Promise<{ serverMs: number, clientMs: number, lines: number }> {
  const stages = productionStages.map(s => `'${s}'`).join(', ')
  await db.raw(`INSERT INTO zone_quantities (id, day_sheet_id, job_id, zone_id, stage, quantity)
    SELECT UUID(), s.id, s.job_id, z.id, ELT(1 + MOD(DAYOFYEAR(s.work_date), 6), ${stages}), 100 + MOD(DAYOFYEAR(s.work_date), 7) * 20
    FROM day_sheets s JOIN jobs j ON j.id = s.job_id JOIN zones z ON z.job_id = s.job_id
    WHERE j.organisation_id = ? AND s.status IN ('full_day', 'half_day')`, [company.organisationId])
  await db.raw('ANALYZE TABLE zone_quantities')
  const lines = Number((await db('zone_quantities').count({ n: '*' }).first())?.n ?? 0)
  const officeId = randomUUID()
  const email = `office.${officeId.slice(0, 8)}@bench.test`
  const hash = (await db('users').whereNotNull('password_hash').first('password_hash')).password_hash
  await db('users').insert({ id: officeId, email, name: 'Bench Office', password_hash: hash })
  await db('memberships').insert({ id: randomUUID(), organisation_id: company.organisationId, user_id: officeId, role: 'office' })
  const cookie = await signIn(url, email, benchPassword)
  const serverMs: number[] = []
  const ask = async () => {
    const response = await fetch(`${url}/api/rates`, { headers: { cookie } })
    if (response.status !== 200) throw new Error(`rates route answered ${response.status}`)
    await response.arrayBuffer()
    serverMs.push(Number(/app;dur=([\d.]+)/.exec(response.headers.get('server-timing') ?? '')?.[1] ?? Number.NaN))
  }
  for (let i = 0; i < 5; i++) await ask()
  serverMs.length = 0
  const clientMs: number[] = []
  for (let r = 0; r < rounds; r++) clientMs.push((await timed(ask)).ms)
  return { serverMs: median(serverMs), clientMs: median(clientMs), lines }
}
