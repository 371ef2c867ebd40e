// The crew lead's daybook as the phone sees it: the server's last copy with every local change on top.
// Screens read from here and save through here; nothing waits for the network.
import { skipHydrate } from 'pinia'
import type { DaySheetRecord, FlagAnswerRecord, LiftRecord, MaterialDropRecord, MaterialEstimateRecord, RecordKind, SyncKind, TimeEntryRecord, ZoneQuantityRecord, ZoneRecord } from '~~/shared/schemas/daybook'
import type { SnapshotFlag } from '~~/shared/types/snapshot'
import { maxStaleKeys, type SnapshotAnswer } from '~~/shared/utils/snapshot-lists'
import { askPersistentStorage, idb } from '~/utils/idb'
import type { LocalRecord, OutboxEntry } from '~/utils/outbox-types'
import { mergeSnapshot, type RefreshState, type SnapshotMeta } from '~/utils/snapshot-merge'
import { shrinkPhoto } from '~/utils/photo-shrink'

export type RecordState = 'on_phone' | 'sending' | 'saved' | 'attention'
export interface PhotoView { id: string, caption: string | null, url: string, state: RecordState }
type PhotoSubject = { type: 'day_sheet' | 'lift' | 'material_drop' | 'review_note', id: string }

export const useDaybookStore = defineStore('daybook', () => {
  const ready = ref(false)
  const meta = ref<SnapshotMeta | null>(null)
  const records = ref<Record<string, LocalRecord>>({})
  const outbox = useOutboxStore()
  const photoUrls = new Map<string, string>()
  const localPhotoUrls = ref<Record<string, string>>({})

  async function reloadRecords(): Promise<void> {
    records.value = Object.fromEntries(await idb.all<LocalRecord>('records'))
    meta.value = await idb.get<SnapshotMeta>('meta', 'snapshot') ?? null
    for (const entry of outbox.entries.filter(e => e.kind === 'photo' && !photoUrls.has(e.id))) {
      const stored = await idb.get<{ bytes: ArrayBuffer, type: string }>('photos', entry.id)
      if (stored) photoUrls.set(entry.id, URL.createObjectURL(new Blob([stored.bytes], { type: stored.type })))
    }
    localPhotoUrls.value = Object.fromEntries(photoUrls)
  }

  async function refreshFromServer(): Promise<void> {
    if (!navigator.onLine) return
    try {
      // Changes only, from where the phone's copy stands (a full snapshot the first time, or when the
      // server no longer has that base); 304 when nothing changed.
      const since = await idb.get<RefreshState>('meta', 'refresh')
      const query = since && since.stale.length <= maxStaleKeys ? { since: since.cursor, ...(since.stale.length ? { stale: since.stale.join(',') } : {}) } : {}
      const response = await $fetch.raw<SnapshotAnswer>('/api/daybook/snapshot', { query })
      if (response.status === 304 || !response._data) return
      await mergeSnapshot(response._data, new Set(outbox.entries.map(e => e.key)))
      await reloadRecords()
    }
    catch { /* offline or signed out: the phone's copy stands */ }
  }

  async function load(): Promise<void> {
    if (ready.value) return
    void askPersistentStorage()
    await outbox.refresh()
    ready.value = true
    outbox.start()
    await refreshFromServer()
  }

  const all = <K extends RecordKind>(kind: K) =>
    Object.values(records.value).filter(r => r.kind === kind).map(r => r.record) as unknown as ({ id: string } & Record<string, unknown>)[]
  const jobs = computed(() => meta.value?.jobs ?? [])
  const roster = computed(() => meta.value?.roster ?? [])
  const sheets = computed(() => all('day_sheet') as unknown as DaySheetRecord[])
  const sheetFor = (jobId: string, workDate: string) => sheets.value.find(s => s.jobId === jobId && s.workDate === workDate)
  /** Crew members with hours on another job's sheet that day (as far as this phone knows), to the names of those jobs. */
  function crewElsewhere(jobId: string, workDate: string): Map<string, string[]> {
    const found = new Map<string, string[]>()
    for (const sheet of sheets.value.filter(s => s.workDate === workDate && s.jobId !== jobId)) {
      const name = jobs.value.find(j => j.id === sheet.jobId)?.name ?? ''
      for (const entry of entriesOf(sheet.id)) found.set(entry.crewMemberId, [...(found.get(entry.crewMemberId) ?? []), name])
    }
    return found
  }
  const childrenOf = <T>(kind: RecordKind, sheetId: string) => all(kind).filter(r => r.daySheetId === sheetId) as unknown as T[]
  const entriesOf = (sheetId: string) => childrenOf<TimeEntryRecord>('time_entry', sheetId)
  const dropsOf = (sheetId: string) => childrenOf<MaterialDropRecord>('material_drop', sheetId)
  const liftsOf = (sheetId: string) => childrenOf<LiftRecord>('lift', sheetId)
  const reviewStateOf = (sheetId: string) => records.value[`day_sheet:${sheetId}`]?.reviewState

  // The foreman's open flags, as last fetched, and the crew lead's answers (sent or still on the phone).
  const flags = computed<SnapshotFlag[]>(() => meta.value?.reviewFlags ?? [])
  const flagsOfJob = (jobId: string) => flags.value.filter(f => f.jobId === jobId)
  const flagsOfDay = (sheetId: string) => flags.value.filter(f => f.daySheetId === sheetId)
  const flagById = (flagId: string) => flags.value.find(f => f.id === flagId)
  const answersOf = (flagId: string) => (Object.values(records.value).filter(r => r.kind === 'flag_answer' && r.record.flagId === flagId).map(r => r.record) as unknown as FlagAnswerRecord[])

  /** An answer to a flag, with its photos, queued like any other change. */
  async function answerFlag(flagId: string, daySheetId: string, body: string, files: File[]): Promise<void> {
    const { flagAnswerRecord } = await import('~~/shared/schemas/daybook')
    const result = flagAnswerRecord.safeParse({ id: crypto.randomUUID(), flagId, body })
    if (!result.success) throw new Error(result.error.issues[0]?.message ?? 'Some fields need a look')
    await outbox.saveRecord('flag_answer', result.data, 'upsert', t('outboxLabel.answer', { text: result.data.body.slice(0, 40) }))
    if (files.length) await addPhotos(files, { type: 'review_note', id: result.data.id }, undefined, daySheetId)
  }

  /** A job's zones with the phone's pending edits on top (the Plan screen writes design values here). */
  const zonesOf = (jobId: string) => (all('zone') as unknown as ZoneRecord[]).filter(z => z.jobId === jobId).sort((a, b) => a.name.localeCompare(b.name))
  const estimatesOf = (jobId: string) => (all('material_estimate') as unknown as MaterialEstimateRecord[]).filter(e => e.jobId === jobId)
  const zoneById = (zoneId: string) => records.value[`zone:${zoneId}`]?.record as unknown as ZoneRecord | undefined

  /**
   * Compacted depth already in a zone below a lift: the zone's lifts on earlier days, then those
   * logged before it on its own day. A sheet not saved yet is the newest day. The days the phone
   * holds count lift by lift; older ones as the zone's total from the snapshot.
   */
  function compactedBeforeIn(zoneId: string, sheetId: string, liftId?: string): number {
    const dateOf = new Map(sheets.value.map(s => [s.id, s.workDate]))
    const ownDate = dateOf.get(sheetId)
    const zoneLifts = (all('lift') as unknown as LiftRecord[]).filter(l => l.zoneId === zoneId)
    const earlier = zoneLifts.filter((l) => {
      const date = dateOf.get(l.daySheetId)
      return l.daySheetId !== sheetId && date !== undefined && (ownDate === undefined || date < ownDate)
    })
    const sameDay = liftsOf(sheetId).filter(l => l.zoneId === zoneId)
    const at = liftId ? sameDay.findIndex(l => l.id === liftId) : -1
    const below = [...earlier, ...(at >= 0 ? sameDay.slice(0, at) : sameDay)]
    // What was compacted before the days the phone holds comes with the zone in the snapshot.
    const older = jobs.value.flatMap(j => j.zones).find(z => z.id === zoneId)?.compactedEarlierIn ?? 0
    return below.reduce((sum, l) => sum + l.compactedIn, older)
  }

  /** What a zone has reached at each stage: the days this phone holds, and older days as the snapshot summed them. */
  function builtSoFar(zoneId: string): Record<string, number> {
    const sums: Record<string, number> = {}
    for (const b of (meta.value?.builtEarlier ?? []).filter(b => b.zoneId === zoneId)) sums[b.stage] = (sums[b.stage] ?? 0) + b.quantity
    for (const q of (all('zone_quantity') as unknown as ZoneQuantityRecord[]).filter(q => q.zoneId === zoneId)) sums[q.stage] = (sums[q.stage] ?? 0) + q.quantity
    return sums
  }

  function lastCrewFor(jobId: string, beforeDate: string): { crewMemberId: string, hours: number }[] {
    const earlier = sheets.value.filter(s => s.jobId === jobId && s.workDate < beforeDate && entriesOf(s.id).length > 0)
      .sort((a, b) => b.workDate.localeCompare(a.workDate))[0]
    return earlier ? entriesOf(earlier.id).map(e => ({ crewMemberId: e.crewMemberId, hours: e.hours })) : []
  }

  function stateOf(kind: SyncKind | 'photo', id: string): RecordState {
    const state = outbox.stateOf(`${kind}:${id}`)
    if (!state) return 'saved'
    return state === 'sending' ? 'sending' : state === 'queued' ? 'on_phone' : 'attention'
  }

  function photosOf(subjectType: PhotoSubject['type'], subjectId: string): PhotoView[] {
    const waiting = outbox.entries.filter((e: OutboxEntry) => e.kind === 'photo' && e.photo?.subjectType === subjectType && e.photo.subjectId === subjectId)
      .map(e => ({ id: e.id, caption: e.photo?.caption ?? null, url: localPhotoUrls.value[e.id] ?? '', state: stateOf('photo', e.id) }))
    const onServer = (meta.value?.photos ?? []).filter(p => p.subjectType === subjectType && p.subjectId === subjectId && !waiting.some(w => w.id === p.id))
      .map(p => ({ id: p.id, caption: p.caption, url: `/api/photos/${p.id}/thumb`, state: 'saved' as const }))
    return [...waiting, ...onServer]
  }

  // The schemas (and zod with them) load on the first save, not with the Today page.
  async function validated<K extends RecordKind>(kind: K, record: unknown) {
    const { recordSchemas } = await import('~~/shared/schemas/daybook')
    const result = recordSchemas[kind].safeParse(record)
    if (!result.success) throw new Error(result.error.issues[0]?.message ?? 'Some fields need a look')
    return result.data as { id: string } & Record<string, unknown>
  }

  // What the outbox list calls each change, in the crew lead's language as they saved it.
  const { t } = useNuxtApp().$i18n
  const labels: Record<RecordKind, (r: Record<string, unknown>) => string> = {
    zone: r => t('outboxLabel.zone', { name: String(r.name) }),
    material_estimate: r => t('outboxLabel.material_estimate', { quantity: String(r.quantity), unit: String(r.unit), material: String(r.material) }),
    day_sheet: r => t('outboxLabel.day_sheet', { date: String(r.workDate) }),
    time_entry: r => t('outboxLabel.time_entry', { name: roster.value.find(p => p.id === r.crewMemberId)?.name ?? t('outboxLabel.crew'), hours: String(r.hours) }),
    material_drop: r => t('outboxLabel.material_drop', { quantity: String(r.quantity), unit: String(r.unit), material: String(r.material) }),
    lift: r => t('outboxLabel.lift', { inches: String(r.compactedIn), material: String(r.material) }),
    zone_quantity: r => t('outboxLabel.zone_quantity', { quantity: String(r.quantity), stage: String(r.stage) }),
  }
  const save = async (kind: RecordKind, record: unknown) => {
    const clean = await validated(kind, record)
    return await outbox.saveRecord(kind, clean, 'upsert', labels[kind](clean))
  }

  async function remove(kind: RecordKind, id: string): Promise<void> {
    const local = records.value[`${kind}:${id}`]
    if (local) await outbox.saveRecord(kind, { ...local.record, id }, 'delete', t('outboxLabel.removed', { what: labels[kind](local.record) }))
  }

  async function setCrewHours(sheetId: string, wanted: { crewMemberId: string, hours: number }[]): Promise<void> {
    const current = entriesOf(sheetId)
    for (const entry of current.filter(e => !wanted.some(w => w.crewMemberId === e.crewMemberId))) await remove('time_entry', entry.id)
    for (const w of wanted) {
      const existing = current.find(e => e.crewMemberId === w.crewMemberId)
      if (existing?.hours === w.hours) continue
      await save('time_entry', { id: existing?.id ?? crypto.randomUUID(), daySheetId: sheetId, crewMemberId: w.crewMemberId, hours: w.hours })
    }
  }

  async function logRainOut(input: { jobId: string, workDate: string, hoursLost: number, reason: string, crewMemberIds?: string[] }): Promise<DaySheetRecord> {
    const existing = sheetFor(input.jobId, input.workDate)
    const sheet = {
      ...(existing ?? { id: crypto.randomUUID(), jobId: input.jobId, workDate: input.workDate, breakMinutes: 0 }),
      status: 'rain_out', hoursLost: input.hoursLost, hoursLostReason: input.reason,
    } as DaySheetRecord
    await save('day_sheet', sheet)
    // The crew that showed up is recorded as present with 0 hours; hours already logged stay.
    if (input.crewMemberIds) {
      const logged = new Map(entriesOf(sheet.id).map(e => [e.crewMemberId, e.hours]))
      await setCrewHours(sheet.id, input.crewMemberIds.map(crewMemberId => ({ crewMemberId, hours: logged.get(crewMemberId) ?? 0 })))
    }
    return sheet
  }

  async function addPhotos(files: File[], subject: PhotoSubject, caption?: string, sheetId?: string): Promise<void> {
    const daySheetId = sheetId ?? (subject.type === 'day_sheet' ? subject.id : (records.value[`${subject.type}:${subject.id}`]?.record.daySheetId as string | undefined))
    for (const file of files) {
      const shrunk = await shrinkPhoto(file)
      const id = crypto.randomUUID()
      await outbox.savePhoto(id, shrunk.bytes, {
        subjectType: subject.type, subjectId: subject.id, daySheetId, caption: caption || undefined,
        takenAt: new Date(file.lastModified || Date.now()).toISOString(), type: shrunk.type, size: shrunk.bytes.byteLength, width: shrunk.width, height: shrunk.height,
      }, caption ? t('outboxLabel.photoCaption', { caption }) : t('outboxLabel.photo'))
    }
  }

  return {
    ready: skipHydrate(ready), jobs, roster, load, reloadRecords, refreshFromServer,
    sheetFor, crewElsewhere, entriesOf, dropsOf, liftsOf, lastCrewFor, photosOf, stateOf, reviewStateOf,
    saveDaySheet: (r: DaySheetRecord) => save('day_sheet', r),
    saveLift: (r: LiftRecord) => save('lift', r),
    saveDrop: (r: MaterialDropRecord) => save('material_drop', r),
    saveZone: (r: ZoneRecord) => save('zone', r),
    saveEstimate: (r: MaterialEstimateRecord) => save('material_estimate', r),
    saveQuantity: (r: ZoneQuantityRecord) => save('zone_quantity', r),
    quantitiesOf: (sheetId: string) => childrenOf<ZoneQuantityRecord>('zone_quantity', sheetId),
    builtSoFar,
    zonesOf, estimatesOf, zoneById, compactedBeforeIn,
    setCrewHours, remove, logRainOut, addPhotos,
    flagsOfJob, flagsOfDay, flagById, answersOf, answerFlag,
    newId: () => crypto.randomUUID(),
  }
})
