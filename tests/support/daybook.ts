// Phone-shaped changes for the sync route, and helpers to send them.
import { randomUUID } from 'node:crypto'
import { fetch } from '@nuxt/test-utils/e2e'
import { call, type Cookie } from './http'
import { testDb } from './db'
import { phoneJpeg } from './images'

export async function addZoneAndCrew(organisationId: string, jobId: string) {
  const zoneId = randomUUID()
  await testDb()('zones').insert({ id: zoneId, job_id: jobId, name: 'Front walk', kind: 'walkway', design_base_depth_in: 6, base_extension_in: 6 })
  const crew = [randomUUID(), randomUUID(), randomUUID()]
  await testDb()('crew_members').insert(crew.map((id, i) => ({ id, organisation_id: organisationId, name: `Crew ${i + 1}` })))
  return { zoneId, crew }
}

export function dayWithWork(jobId: string, zoneId: string, crew: string[], workDate = '2026-11-24') {
  const sheetId = randomUUID()
  return {
    sheetId,
    changes: [
      { kind: 'day_sheet', op: 'upsert', baseRevision: null, record: { id: sheetId, jobId, workDate, status: 'full_day', startedAt: '07:00', finishedAt: '15:30', weatherConditions: 'Clear', temperatureF: 54, hoursLost: 0, workDone: 'Base for the front walk' } },
      ...crew.map(crewMemberId => ({ kind: 'time_entry', op: 'upsert', baseRevision: null, record: { id: randomUUID(), daySheetId: sheetId, crewMemberId, hours: 8 } })),
      { kind: 'lift', op: 'upsert', baseRevision: null, record: { id: randomUUID(), daySheetId: sheetId, zoneId, material: '3/4 in crushed stone', looseIn: 4, compactedIn: 3, passes: 4, compactorClass: 'plate_medium', moistureNote: 'Damp' } },
      { kind: 'material_drop', op: 'upsert', baseRevision: null, record: { id: randomUUID(), daySheetId: sheetId, material: '3/4 in crushed stone', quantity: 12, unit: 'ton', stagedAt: 'Driveway apron', ticketNumber: 'T-100' } },
    ],
  }
}

export async function sync(cookie: Cookie, changes: unknown[], key = randomUUID()) {
  const response = await call('POST', '/api/sync', { cookie, body: { changes }, headers: { 'idempotency-key': key } })
  return { response, key, body: await response.json() }
}

/** A 640 × 480 photo of a record, uploaded as the phone does; answers the new photo's id. */
export async function uploadPhoto(cookie: Cookie, subjectType: string, subjectId: string, caption?: string): Promise<string> {
  const id = randomUUID()
  const query = new URLSearchParams({ subjectType, subjectId, ...(caption === undefined ? {} : { caption }) })
  const response = await fetch(`/api/photos/${id}?${query}`, {
    method: 'PUT', body: new Uint8Array(await phoneJpeg({ width: 640, height: 480 })), headers: { 'content-type': 'image/jpeg', cookie },
  })
  if (response.status !== 201) throw new Error(`the photo upload answered ${response.status}`)
  return id
}
