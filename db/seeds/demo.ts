// Writes the demo scenario (db/seeds/demo-scenario.ts) into an empty database, dated around today.
import { randomUUID } from 'node:crypto'
import type { Knex } from 'knex'
import dayjs, { type Dayjs } from 'dayjs'
import { Hash } from '@adonisjs/hash'
import { Scrypt } from '@adonisjs/hash/drivers/scrypt'
import type { Storage } from 'unstorage'
import { photoKeys } from '../../shared/utils/photos'
import { company, crew, demoPassword, jobs, users, type DemoJob } from './demo-scenario'
import { demoImage, type DemoScene } from './demo-images'
import { historyJobs } from './demo-history'

/** Moves a date by whole working days (Monday to Friday). */
function addWorkingDays(from: Dayjs, days: number): Dayjs {
  let date = from
  const step = days < 0 ? -1 : 1
  for (let left = Math.abs(days); left > 0;) {
    date = date.add(step, 'day')
    if (date.day() !== 0 && date.day() !== 6) left--
  }
  return date
}

function lastWorkingDay(date: Dayjs): Dayjs {
  return date.day() === 0 || date.day() === 6 ? addWorkingDays(date, -1) : date
}

export async function databaseIsEmpty(knex: Knex): Promise<boolean> {
  const row = await knex('organisations').count({ n: '*' }).first()
  return Number(row?.n ?? 0) === 0
}

export async function seedDemo(knex: Knex, photos: Storage, today = dayjs()): Promise<void> {
  // The same scrypt hasher (and defaults) as nuxt-auth-utils' hashPassword, so the sign-ins verify.
  const passwordHash = await new Hash(new Scrypt({})).make(demoPassword)
  const organisationId = randomUUID()
  const userIds = new Map(users.map(u => [u.key, randomUUID()]))
  const crewIds = new Map(crew.map(c => [c.key, randomUUID()]))
  const idOf = (map: Map<string, string>, key: string): string => {
    const id = map.get(key)
    if (!id) throw new Error(`demo scenario names an unknown key: ${key}`)
    return id
  }

  await knex.transaction(async (trx) => {
    await trx('organisations').insert({ id: organisationId, name: company.name, time_zone: company.timeZone, holidays: JSON.stringify([]) })
    await trx('users').insert(users.map(u => ({ id: idOf(userIds, u.key), email: u.email, name: u.name, locale: u.locale, password_hash: passwordHash })))
    await trx('memberships').insert(users.map(u => ({ id: randomUUID(), organisation_id: organisationId, user_id: idOf(userIds, u.key), role: u.role })))
    await trx('crew_members').insert(crew.map(c => ({
      id: idOf(crewIds, c.key), organisation_id: organisationId, name: c.name, trade_role: c.tradeRole,
      user_id: c.userKey ? idOf(userIds, c.userKey) : null,
    })))
    // The past year's finished jobs, dated like the others (working days before today).
    const history = historyJobs((ago, offset) => addWorkingDays(lastWorkingDay(today.startOf('day')), offset - ago).month() + 1)
    for (const job of [...jobs, ...history]) {
      await seedJob(trx, photos, job, { organisationId, today, foremanId: idOf(userIds, 'foreman'), leadId: idOf(userIds, job.lead), crewIds })
    }
  })
}

interface JobContext { organisationId: string, today: Dayjs, foremanId: string, leadId: string, crewIds: Map<string, string> }

async function seedJob(trx: Knex.Transaction, photos: Storage, job: DemoJob, ctx: JobContext): Promise<void> {
  const jobId = randomUUID()
  const start = addWorkingDays(lastWorkingDay(ctx.today.startOf('day')), -job.startedWorkingDaysAgo)
  await trx('jobs').insert({
    id: jobId, organisation_id: ctx.organisationId, name: job.name, customer_name: job.customer, customer_phone: job.phone,
    customer_email: job.email, site_address: job.address, status: job.status, crew_days_bid: job.crewDaysBid,
    crew_size: job.crewSize, person_hours_bid: job.personHoursBid, start_date: start.format('YYYY-MM-DD'),
    foreman_id: ctx.foremanId, homeowner_updates: job.homeownerUpdates, notes: job.notes,
  })
  await trx('job_crew_leads').insert({ job_id: jobId, user_id: ctx.leadId })
  const zoneIds = new Map(job.zones.map(z => [z.key, randomUUID()]))
  await trx('zones').insert(job.zones.map(z => ({
    id: zoneIds.get(z.key), job_id: jobId, name: z.name, kind: z.kind, design_base_depth_in: z.depthIn,
    base_extension_in: z.extensionIn, area_sq_ft: z.areaSqFt ?? null, length_ft: z.lengthFt ?? null, risers: z.risers ?? null, crew_days_bid: z.crewDaysBid ?? null,
  })))
  if (job.estimate.length) await trx('material_estimates').insert(job.estimate.map(e => ({ id: randomUUID(), job_id: jobId, ...e })))

  const photo = async (scene: DemoScene, caption: string, subject: { type: string, id: string }, dayId: string, takenAt: Dayjs) => {
    const id = randomUUID()
    const keys = photoKeys(ctx.organisationId, id)
    const image = await demoImage(scene, caption)
    await photos.setItemRaw(keys.display, image.display)
    await photos.setItemRaw(keys.thumb, image.thumb)
    await trx('photos').insert({
      id, organisation_id: ctx.organisationId, job_id: jobId, day_sheet_id: dayId, subject_type: subject.type, subject_id: subject.id,
      caption, taken_at: takenAt.toDate(), width: image.width, height: image.height, display_key: keys.display, thumb_key: keys.thumb,
      display_bytes: image.display.length, thumb_bytes: image.thumb.length, uploaded_by: ctx.leadId,
    })
  }

  const liftCount = new Map<string, number>()
  for (const day of job.days) {
    const date = addWorkingDays(start, day.offset)
    const dayId = randomUUID()
    const hours = day.status === 'full_day' ? 8 : day.status === 'half_day' ? 4 : 0
    const reviewed = day.review !== 'waiting'
    await trx('day_sheets').insert({
      id: dayId, job_id: jobId, work_date: date.format('YYYY-MM-DD'), status: day.status,
      started_at: hours ? '07:00' : null, finished_at: hours ? (hours === 8 ? '15:30' : '11:00') : null,
      weather_conditions: day.weather, rain_in: day.rainIn ?? 0, temperature_f: day.tempF,
      hours_lost: day.hoursLost ?? 0, hours_lost_reason: day.lostReason ?? null, work_done: day.workDone,
      author_id: ctx.leadId, review_state: day.review, reviewed_by: reviewed ? ctx.foremanId : null,
      reviewed_at: reviewed ? date.hour(20).toDate() : null,
    })
    if (hours > 0 && day.crew.length > 0) {
      // Hours lost on a full day are hours not worked; a half day's lost half is already left out.
      const worked = day.status === 'full_day' ? hours - (day.hoursLost ?? 0) : hours
      await trx('time_entries').insert(day.crew.map(key => ({ id: randomUUID(), day_sheet_id: dayId, crew_member_id: ctx.crewIds.get(key), hours: worked })))
    }
    if (day.built?.length) {
      await trx('zone_quantities').insert(day.built.map(b => ({ id: randomUUID(), day_sheet_id: dayId, job_id: jobId, zone_id: zoneIds.get(b.zone), stage: b.stage, quantity: b.quantity, cap_lf: b.capLf ?? null })))
    }
    for (const drop of day.drops ?? []) {
      const dropId = randomUUID()
      await trx('material_drops').insert({ id: dropId, day_sheet_id: dayId, job_id: jobId, material: drop.material, quantity: drop.quantity, unit: drop.unit, staged_at: drop.stagedAt, ticket_number: drop.ticket })
      if (drop.photo) await photo('ticket', `Ticket ${drop.ticket}`, { type: 'material_drop', id: dropId }, dayId, date.hour(9))
    }
    const liftIds: string[] = []
    for (const lift of day.lifts ?? []) {
      const liftId = randomUUID()
      const sequence = (liftCount.get(lift.zone) ?? 0) + 1
      liftCount.set(lift.zone, sequence)
      liftIds.push(liftId)
      await trx('lifts').insert({
        id: liftId, day_sheet_id: dayId, job_id: jobId, zone_id: zoneIds.get(lift.zone), sequence, material: lift.material,
        loose_in: lift.looseIn, compacted_in: lift.compactedIn, passes: lift.passes, compactor_class: lift.compactor,
        moisture_note: 'Damp, holds a squeeze',
      })
      if (lift.photo) await photo('lift', `Lift ${sequence}: ${lift.compactedIn} in compacted`, { type: 'lift', id: liftId }, dayId, date.hour(13))
    }
    if (day.review === 'approved' || day.flag) {
      const flagged = day.flag ? liftIds[day.flag.lift] : undefined
      await trx('review_notes').insert({
        id: randomUUID(), organisation_id: ctx.organisationId, job_id: jobId, day_sheet_id: dayId,
        subject_type: flagged ? 'lift' : 'day_sheet', subject_id: flagged ?? dayId, kind: flagged ? 'flag' : 'approve',
        reason: day.flag?.reason ?? null, body: day.flag?.body ?? null, author_id: ctx.foremanId,
      })
    }
  }
}

// For knex's seed runner; `npm start` calls seedDemo itself, and only on an empty database.
export async function seed(knex: Knex): Promise<void> {
  const { createStorage } = await import('unstorage')
  const fsDriver = (await import('unstorage/drivers/fs')).default
  if (await databaseIsEmpty(knex)) await seedDemo(knex, createStorage({ driver: fsDriver({ base: process.env.NUXT_PHOTOS_DIR || '.data/photos' }) }))
}
