// The office sets up and edits a job: the customer, the site, the people, the bid, the zones with
// their design values and the material estimate, in one transaction with one audit row.
import { createHash } from 'node:crypto'
import type { Knex } from 'knex'
import { matchKey } from '../../shared/utils/text-match'
import type { Member } from './members'
import type { JobCreateBody, JobUpdateBody } from '../../shared/schemas/jobs'
import type { RecordOf } from '../../shared/schemas/daybook'
import { fromRow, kindMaps, toColumns } from './sync/kinds'

type JobFields = Omit<JobCreateBody, 'id'>

const fieldError = (statusCode: number, statusMessage: string, fieldErrors: Record<string, string>) =>
  createError({ statusCode, statusMessage, data: { fieldErrors } })

function jobColumns(body: JobFields) {
  return {
    name: body.name, customer_name: body.customerName, customer_phone: body.customerPhone ?? null, customer_email: body.customerEmail ?? null,
    site_address: body.siteAddress, status: body.status, foreman_id: body.foremanId ?? null, crew_days_bid: body.crewDaysBid,
    crew_size: body.crewSize, person_hours_bid: body.personHoursBid, start_date: body.startDate ?? null,
    homeowner_updates: body.homeownerUpdates, notes: body.notes ?? null,
  }
}

// Zones and estimate lines are the phone's records without their job id: the sync's mapping serves both.
type PlanKind = 'zone' | 'material_estimate'
type Line<K extends PlanKind> = Omit<RecordOf[K], 'jobId'>
const tableOf = (kind: PlanKind) => kindMaps[kind].table
const toRow = <K extends PlanKind>(kind: K, jobId: string, line: Line<K>) => toColumns(kind, { ...line, jobId } as RecordOf[K])
function toLine<K extends PlanKind>(kind: K, row: Record<string, unknown>): Line<K> {
  const { jobId: _jobId, ...line } = fromRow(kind, row)
  return line as Line<K>
}

/** The foreman must be an active foreman of the company, each crew lead an active crew lead. */
async function checkPeople(trx: Knex.Transaction, organisationId: string, body: JobFields): Promise<void> {
  const ids = [...(body.foremanId ? [body.foremanId] : []), ...body.crewLeadIds]
  if (!ids.length) return
  const rows = await trx('memberships').where({ organisation_id: organisationId, active: true }).whereIn('user_id', ids).select('user_id', 'role')
  const roleOf = new Map(rows.map(r => [r.user_id as string, r.role as string]))
  const errors: Record<string, string> = {}
  if (body.foremanId && roleOf.get(body.foremanId) !== 'foreman') errors.foremanId = 'Choose one of the company\'s foremen'
  body.crewLeadIds.forEach((leadId, i) => {
    if (roleOf.get(leadId) !== 'crew_lead') errors[`crewLeadIds.${i}`] = 'Choose one of the company\'s crew leads'
  })
  if (Object.keys(errors).length) throw fieldError(422, 'Some fields need a look', errors)
}

/** Zones and estimate lines: the ids must not belong to another job. */
async function checkIdsFree(trx: Knex.Transaction, jobId: string, body: JobFields): Promise<void> {
  const errors: Record<string, string> = {}
  for (const [table, list, field] of [['zones', body.zones, 'zones'], ['material_estimates', body.materials, 'materials']] as const) {
    if (!list.length) continue
    const taken = await trx(table).whereIn('id', list.map(x => x.id)).whereNot('job_id', jobId).select('id')
    const takenIds = new Set(taken.map(t => t.id as string))
    list.forEach((x, i) => {
      if (takenIds.has(x.id)) errors[`${field}.${i}.id`] = 'This line belongs to another job'
    })
  }
  if (Object.keys(errors).length) throw fieldError(409, 'A zone or estimate line belongs to another job', errors)
}

async function writeLeads(trx: Knex.Transaction, jobId: string, leadIds: string[]): Promise<void> {
  await trx('job_crew_leads').where({ job_id: jobId }).delete()
  if (leadIds.length) await trx('job_crew_leads').insert(leadIds.map(user_id => ({ job_id: jobId, user_id })))
}

/** Creates the job, or answers with the one an earlier attempt of the same save made (same id). */
export async function createJob(office: Member, body: JobCreateBody): Promise<{ status: 200 | 201, job: JobSetup }> {
  try {
    await useDb().transaction(async (trx) => {
      await checkPeople(trx, office.organisationId, body)
      await checkIdsFree(trx, body.id, body)
      await trx('jobs').insert({ id: body.id, organisation_id: office.organisationId, ...jobColumns(body) })
      await writeLeads(trx, body.id, body.crewLeadIds)
      await insertLines(trx, 'zone', body.id, body.zones)
      await insertLines(trx, 'material_estimate', body.id, body.materials)
      await audit(trx, office, 'job.created', 'job', body.id, { name: body.name, crewDaysBid: body.crewDaysBid, personHoursBid: body.personHoursBid })
    })
  }
  catch (error) {
    // A double tap, or a retry whose first answer was lost: the job is there already.
    if ((error as { code?: string }).code !== 'ER_DUP_ENTRY') throw error
    const existing = await useDb()('jobs').where({ id: body.id }).first('organisation_id')
    if (!existing) throw sameLineTwice()
    if (existing.organisation_id !== office.organisationId) throw fieldError(409, 'This job could not be saved; reload the form and try again', { _form: 'Reload the form' })
    return { status: 200, job: await jobSetup(office, body.id) }
  }
  return { status: 201, job: await jobSetup(office, body.id) }
}

/** Saves the whole form over the job; refused (409) when someone saved it since it was loaded. */
export async function updateJob(office: Member, jobId: string, body: JobUpdateBody): Promise<JobSetup> {
  const hash = createHash('sha256').update(JSON.stringify(body)).digest('hex')
  await useDb().transaction(trx => writeJob(trx, office, jobId, body, hash)).catch((error: unknown) => {
    // What the form's own check cannot see: a name the collation folds that matchKey does not.
    throw (error as { code?: string }).code === 'ER_DUP_ENTRY' ? sameLineTwice() : error
  })
  return await jobSetup(office, jobId)
}

const sameLineTwice = () => fieldError(422, 'The estimate lists a material twice in the same unit', { materials: 'The estimate lists a material twice in the same unit (letter case and accents do not count)' })

/** The form written over the job, inside the caller's transaction. */
async function writeJob(trx: Knex.Transaction, office: Member, jobId: string, body: JobUpdateBody, hash: string): Promise<void> {
  const job = await trx('jobs').where({ id: jobId, organisation_id: office.organisationId }).forUpdate().first()
  if (!job) throw createError({ statusCode: 404, statusMessage: 'No such job' })
  if (job.revision !== body.revision && await isRepeat(trx, office, jobId, job.revision, hash)) return
  if (job.revision !== body.revision) {
    throw createError({ statusCode: 409, statusMessage: 'Someone saved this job after you opened it; reload to see their changes', data: { revision: job.revision } })
  }
  await checkPeople(trx, office.organisationId, body)
  await checkIdsFree(trx, jobId, body)
  await trx('jobs').where({ id: jobId }).update({ ...jobColumns(body), revision: job.revision + 1, updated_at: new Date() })
  await writeLeads(trx, jobId, body.crewLeadIds)
  await writeLines(trx, 'zone', jobId, body.zones, await removeZones(trx, jobId, body.zones))
  await writeLines(trx, 'material_estimate', jobId, body.materials, await removeMaterials(trx, jobId, body.materials))
  const bidChanged = Number(job.crew_days_bid) !== body.crewDaysBid || Number(job.person_hours_bid) !== body.personHoursBid || job.crew_size !== body.crewSize
  await audit(trx, office, 'job.updated', 'job', jobId, {
    revision: job.revision + 1,
    bodyHash: hash,
    ...(bidChanged ? { bid: { from: { crewDays: Number(job.crew_days_bid), personHours: Number(job.person_hours_bid), crewSize: job.crew_size }, to: { crewDays: body.crewDaysBid, personHours: body.personHoursBid, crewSize: body.crewSize } } } : {}),
  })
}

/** The same person saving the same form twice (a double tap, a retry after a lost answer): the first save stands. */
async function isRepeat(trx: Knex.Transaction, office: Member, jobId: string, revision: number, hash: string): Promise<boolean> {
  const last = await trx('audit_log').where({ subject_type: 'job', subject_id: jobId }).orderBy('id', 'desc').first('action', 'actor_id', 'detail')
  if (last?.action !== 'job.updated' || last.actor_id !== office.userId) return false
  const detail = (typeof last.detail === 'string' ? JSON.parse(last.detail) : last.detail) as { revision?: number, bodyHash?: string }
  return detail.revision === revision && detail.bodyHash === hash
}

/** Zones no longer on the form go, unless lifts are logged on them; answers the ids of those that stay. */
async function removeZones(trx: Knex.Transaction, jobId: string, zones: Line<'zone'>[]): Promise<Set<string>> {
  const existing = await trx('zones').where({ job_id: jobId }).select('id', 'name')
  const keep = new Set(zones.map(z => z.id))
  const gone = existing.filter(z => !keep.has(z.id))
  const known = new Set(existing.filter(z => keep.has(z.id)).map(z => z.id as string))
  if (!gone.length) return known
  // A zone with lifts logged on it carries the proof of its base, one with work counted as built its
  // history: it stays.
  const ids = gone.map(z => z.id)
  const used = await trx('lifts').whereIn('zone_id', ids).distinct('zone_id').union(trx('zone_quantities').whereIn('zone_id', ids).distinct('zone_id'))
  if (used.length) {
    const names = gone.filter(z => used.some(u => u.zone_id === z.id)).map(z => z.name).join(', ')
    throw fieldError(409, `Lifts or built quantities are logged on ${names}: the zone cannot be removed`, { zones: `Lifts or built quantities are logged on ${names}` })
  }
  await trx('zones').whereIn('id', gone.map(z => z.id)).delete()
  return known
}

/** Estimate lines no longer on the form go; answers the ids of those that stay. */
async function removeMaterials(trx: Knex.Transaction, jobId: string, lines: Line<'material_estimate'>[]): Promise<Set<string>> {
  const keep = lines.map(l => l.id)
  await trx('material_estimates').where({ job_id: jobId }).modify((q) => {
    if (keep.length) q.whereNotIn('id', keep)
  }).delete()
  return new Set(await trx('material_estimates').where({ job_id: jobId }).pluck('id'))
}

async function insertLines<K extends PlanKind>(trx: Knex.Transaction, kind: K, jobId: string, lines: Line<K>[]): Promise<void> {
  if (lines.length) await trx(tableOf(kind)).insert(lines.map(line => toRow(kind, jobId, line)))
}

/** The lines already stored (`known`) are updated, each bumping the revision the phones check; the new ones inserted. */
async function writeLines<K extends PlanKind>(trx: Knex.Transaction, kind: K, jobId: string, lines: Line<K>[], known: Set<string>): Promise<void> {
  // Updates first: a new estimate line may take the material and unit an updated line gave up.
  const kept = lines.filter(l => known.has(l.id))
  if (kind === 'material_estimate') await freeChangedNames(trx, kept as Line<'material_estimate'>[])
  for (const line of kept) {
    await trx(tableOf(kind)).where({ id: line.id }).update({ ...toRow(kind, jobId, line), revision: trx.raw('revision + 1'), updated_at: new Date() })
  }
  await insertLines(trx, kind, jobId, lines.filter(l => !known.has(l.id)))
}

/**
 * Kept estimate lines may trade their material and unit: when two or more change them, each goes
 * through a name of its own first, so that the unique key never sees two lines with one name midway.
 */
async function freeChangedNames(trx: Knex.Transaction, kept: Line<'material_estimate'>[]): Promise<void> {
  if (kept.length < 2) return
  const stored = new Map((await trx('material_estimates').whereIn('id', kept.map(l => l.id)).select('id', 'material', 'unit'))
    .map(row => [row.id as string, `${matchKey(row.material)}|${matchKey(row.unit)}`]))
  const changed = kept.filter(l => stored.get(l.id) !== `${matchKey(l.material)}|${matchKey(l.unit)}`)
  if (changed.length < 2) return
  await trx('material_estimates').whereIn('id', changed.map(l => l.id)).update({ material: trx.raw('CONCAT(CHAR(1), id)') })
}

export interface JobSetup extends Omit<JobUpdateBody, 'status'> {
  id: string
  status: JobUpdateBody['status']
}

/** The job as the setup form shows it. */
export async function jobSetup(member: Member, jobId: string): Promise<JobSetup> {
  const job = await requireVisibleJob(member, jobId)
  const [leads, zones, materials] = await Promise.all([
    useDb()('job_crew_leads').where({ job_id: jobId }).pluck('user_id'),
    useDb()('zones').where({ job_id: jobId }).orderBy('created_at').orderBy('name'),
    useDb()('material_estimates').where({ job_id: jobId }).orderBy('material'),
  ])
  return {
    id: job.id, revision: job.revision, name: job.name, customerName: job.customer_name, customerPhone: job.customer_phone, customerEmail: job.customer_email,
    siteAddress: job.site_address, status: job.status, foremanId: job.foreman_id, crewLeadIds: leads, crewDaysBid: Number(job.crew_days_bid),
    crewSize: job.crew_size, personHoursBid: Number(job.person_hours_bid), startDate: job.start_date, homeownerUpdates: Boolean(job.homeowner_updates), notes: job.notes,
    zones: zones.map(z => toLine('zone', z)),
    materials: materials.map(m => toLine('material_estimate', m)),
  }
}

/** The people the form offers: the company's active foremen and crew leads. */
export async function jobPeople(organisationId: string) {
  const rows = await useDb()('memberships as m').join('users as u', 'u.id', 'm.user_id')
    .where({ 'm.organisation_id': organisationId, 'm.active': true }).whereIn('m.role', ['foreman', 'crew_lead'])
    .orderBy('u.name').select('u.id', 'u.name', 'm.role')
  return { foremen: rows.filter(r => r.role === 'foreman').map(r => ({ id: r.id, name: r.name })), crewLeads: rows.filter(r => r.role === 'crew_lead').map(r => ({ id: r.id, name: r.name })) }
}
