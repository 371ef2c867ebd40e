import type { Knex } from 'knex'
import type { Member } from './members'

/**
 * The jobs a member may see: the office sees the company's; a foreman the jobs assigned to them;
 * a crew lead the jobs they lead.
 */
export function visibleJobs(member: Member): Knex.QueryBuilder {
  const query = useDb()('jobs').where('jobs.organisation_id', member.organisationId)
  if (member.role === 'foreman') query.andWhere('jobs.foreman_id', member.userId)
  if (member.role === 'crew_lead') {
    query.whereExists(q => q.select(useDb().raw('1')).from('job_crew_leads as l').whereRaw('l.job_id = jobs.id').andWhere('l.user_id', member.userId))
  }
  return query
}

/** A job the member may see, or 404 (never 403: another company's job must not be confirmed to exist). */
export async function requireVisibleJob(member: Member, jobId: string) {
  const job = await visibleJobs(member).andWhere('jobs.id', jobId).first('jobs.*')
  if (!job) throw createError({ statusCode: 404, statusMessage: 'No such job' })
  return job
}
