// A job's rollup: crew-days, hours, weather, zones and materials against the bid and the estimate,
// each part one SQL aggregate (server/utils/rollup-sql.ts), run side by side on the pool.
import type { JobRollup, RollupMaterial, RollupPoint, RollupTotals, RollupZone } from '../../shared/types/rollup'
import type { Member } from './members'
import { rollupStatements, type Statement } from './rollup-sql'

async function rowsOf<T>(statement: Statement): Promise<T[]> {
  const [rows] = await useDb().raw(statement.sql, statement.bindings) as unknown as [T[]]
  return rows
}

/**
 * The rollup of a job, or 404 when the member may not see it. The access rule (visibleJobs) is part
 * of the totals statement rather than a query before it, and nothing is answered unless the totals
 * come back. Everything is read while the membership is confirmed (`member`, the route's
 * requireMember), so that its round trip is not added to the statements': the zones, materials and
 * series do not depend on who asks, and the totals are read under the role the cookie names
 * (`claimed`) and read again if the membership says otherwise. Nothing is answered before it is confirmed.
 */
export async function jobRollupFor(member: Promise<Member>, claimed: Member | undefined, jobId: string): Promise<JobRollup> {
  const parts = rollupStatements(jobId)
  const totalsAs = (who: Member) => {
    const visible = visibleJobs(who).andWhere('jobs.id', jobId).select('jobs.id').toSQL().toNative()
    return rowsOf<RollupTotals>(rollupStatements(jobId, { sql: visible.sql, bindings: visible.bindings as (string | number)[] }).totals)
  }
  const early = claimed ? totalsAs(claimed) : undefined
  const details = Promise.all([rowsOf<RollupZone>(parts.zones), rowsOf<RollupMaterial>(parts.materials), rowsOf<RollupPoint>(parts.series)])
  // Awaited only after the membership is confirmed; a failure before then must not go unhandled.
  details.catch(() => {})
  early?.catch(() => {})
  const confirmed = await member
  const sameRule = early && claimed && claimed.role === confirmed.role && claimed.userId === confirmed.userId && claimed.organisationId === confirmed.organisationId
  const [totals] = await Promise.all([sameRule ? early : totalsAs(confirmed), details])
  if (!totals[0]) throw createError({ statusCode: 404, statusMessage: 'No such job' })
  const [zones, materials, series] = await details
  return { jobId, totals: totals[0], zones, materials, series }
}
