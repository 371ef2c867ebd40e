// Photos from the phone's outbox: checked, made upright and stripped of EXIF/GPS, kept in two sizes
// (photoSizes), and recorded once per client UUID so that a retried upload is harmless.
import { createHash } from 'node:crypto'
import type { H3Event } from 'h3'
import sharp from 'sharp'
import type { Member } from './members'
import { QueueFull, SlotQueue } from './decode-slots'
import { abortWhenGone, receiveBody, type BodyLimits } from './request-body'
import { photoKeys, photoSizes, photoUrls } from '../../shared/utils/photos'
import { photoContentTypes, type PhotoRecord, type PhotoSizeName, type PhotoSubjectType, type PhotoUploadQuery } from '../../shared/schemas/photos'

// Each upload is a new image: libvips' operation cache would only hold memory (../shared/STACK.md).
sharp.cache(false)

export const photoBodyLimit = 20 * 1024 * 1024

// Two decodes at a time keep the server's memory bounded; eight photos may wait for them. Bodies are
// read before the queue (upload-body.ts), at most a dozen at once: each holds up to photoBodyLimit.
const decodeQueue = new SlotQueue(2, 8)
const maxReceiving = 12
const retryAfterSeconds = 5
let receiving = 0

/** What the photo route is busy with, for /api/health. */
export function uploadLoad() {
  return { receiving, ...decodeQueue.load() }
}

async function receivePhoto(event: H3Event): Promise<Buffer> {
  const { photos } = useRuntimeConfig()
  const limits: BodyLimits = { maxBytes: photoBodyLimit, idleMs: Number(photos.idleSeconds) * 1000, totalMs: Number(photos.totalSeconds) * 1000, drainBytes: photoBodyLimit }
  receiving++
  try {
    return await receiveBody(event, limits, tooLarge)
  }
  finally {
    receiving--
  }
}

// Phone cameras save 12–50 MP by default; anything larger is refused before it is decoded.
const maxInputPixels = 50_000_000
const sharpInput = { limitInputPixels: maxInputPixels, failOn: 'error' } as const

const subjects: Record<PhotoSubjectType, { table: string, daySheetId: string }> = {
  day_sheet: { table: 'day_sheets', daySheetId: 's.id' },
  lift: { table: 'lifts', daySheetId: 's.day_sheet_id' },
  material_drop: { table: 'material_drops', daySheetId: 's.day_sheet_id' },
  review_note: { table: 'review_notes', daySheetId: 's.day_sheet_id' },
}

interface PhotoRow {
  id: string, organisation_id: string, job_id: string, subject_type: PhotoSubjectType, subject_id: string, caption: string | null
  taken_at: Date | null, width: number, height: number, display_key: string, thumb_key: string
}

/** Stores an upload, or answers with what an earlier upload of the same id stored. */
export async function ingestPhoto(event: H3Event, member: Member, id: string, query: PhotoUploadQuery): Promise<{ status: 200 | 201, photo: PhotoRecord }> {
  if (Number(getRequestHeader(event, 'content-length') ?? 0) > photoBodyLimit) throw tooLarge()
  const contentType = getRequestHeader(event, 'content-type')?.split(';')[0]?.trim().toLowerCase()
  if (!photoContentTypes.some(t => t === contentType)) throw notAnImage()
  const subject = await requireSubject(member, query.subjectType, query.subjectId)
  // A photo already stored answers at once, whatever is still on its way.
  const stored = await storedPhoto(id)
  if (stored) return { status: 200, photo: replayOf(stored, query) }
  if (receiving >= maxReceiving) throw busy(event)
  const gone = abortWhenGone(event)
  const bytes = await receivePhoto(event)
  // A retry may arrive while the first attempt is still being processed: take them one at a time.
  return await oneAtATime(id, async () => {
    const stored = await storedPhoto(id)
    if (stored) return { status: 200, photo: replayOf(stored, query) }
    const image = await decodeQueue.run(() => processImage(bytes), gone).catch((error: unknown) => {
      throw error instanceof QueueFull ? busy(event) : error
    })
    const keys = photoKeys(member.organisationId, id)
    const row = {
      id, organisation_id: member.organisationId, job_id: subject.jobId, day_sheet_id: subject.daySheetId,
      subject_type: query.subjectType, subject_id: query.subjectId, caption: query.caption ?? null,
      taken_at: query.takenAt ? new Date(query.takenAt) : await exifTakenAt(image.exif, member.organisationId),
      width: image.width, height: image.height, display_key: keys.display, thumb_key: keys.thumb,
      display_bytes: image.display.length, thumb_bytes: image.thumb.length, uploaded_by: member.userId,
    }
    // The row only once both sizes are stored, so a listed photo always has its images.
    try {
      await useStorage('photos').setItemRaw(keys.display, image.display)
      await useStorage('photos').setItemRaw(keys.thumb, image.thumb)
      await useDb()('photos').insert(row)
    }
    catch (error) {
      // Another server process stored the same id first: its blobs are under the same keys, keep them.
      const winner = (error as { code?: string }).code === 'ER_DUP_ENTRY' && await storedPhoto(id)
      if (winner) return { status: 200, photo: replayOf(winner, query) }
      await Promise.allSettled([useStorage('photos').removeItem(keys.display), useStorage('photos').removeItem(keys.thumb)])
      throw error
    }
    return { status: 201, photo: recordOf(row) }
  })
}

/** The bytes of one size of a photo on a job the member can see; 404 otherwise. */
export async function readPhoto(member: Member, id: string, size: PhotoSizeName): Promise<Buffer> {
  const photo = await visibleJobs(member).join('photos as p', 'p.job_id', 'jobs.id').where('p.id', id).first<PhotoRow | undefined>('p.display_key', 'p.thumb_key')
  const bytes = photo && await useStorage('photos').getItemRaw<Uint8Array | ArrayBuffer>(size === 'display' ? photo.display_key : photo.thumb_key)
  if (!bytes) throw createError({ statusCode: 404, statusMessage: 'No such photo' })
  return Buffer.from(bytes instanceof ArrayBuffer ? new Uint8Array(bytes) : bytes)
}

/** Serves stored photo bytes: they never change under an id, so the browser may keep them for good. */
export function sendPhoto(event: H3Event, bytes: Buffer): Buffer | null {
  const etag = `"${createHash('sha256').update(bytes).digest('base64url').slice(0, 27)}"`
  setResponseHeaders(event, { 'content-type': 'image/jpeg', 'cache-control': 'private, max-age=31536000, immutable', 'etag': etag })
  if (getRequestHeader(event, 'if-none-match')?.split(',').some(tag => tag.trim() === etag)) {
    setResponseStatus(event, 304)
    return null
  }
  return bytes
}

async function requireSubject(member: Member, type: PhotoSubjectType, id: string): Promise<{ jobId: string, daySheetId: string }> {
  const { table, daySheetId } = subjects[type]
  // Joined to the jobs the member can see: a record on anyone else's job is as absent as a missing one.
  const subject = await visibleJobs(member).join(`${table} as s`, 's.job_id', 'jobs.id').where('s.id', id).first('s.job_id as jobId', `${daySheetId} as daySheetId`)
  if (!subject) throw createError({ statusCode: 404, statusMessage: 'The record this photo belongs to is not on the server yet' })
  return subject
}

function replayOf(stored: PhotoRow, query: PhotoUploadQuery): PhotoRecord {
  if (stored.subject_type !== query.subjectType || stored.subject_id !== query.subjectId) {
    throw createError({ statusCode: 409, statusMessage: 'A different photo was already uploaded under this id' })
  }
  return recordOf(stored)
}

function recordOf(row: Pick<PhotoRow, 'id' | 'width' | 'height' | 'taken_at' | 'caption' | 'subject_type' | 'subject_id'>): PhotoRecord {
  return {
    id: row.id, width: row.width, height: row.height, takenAt: row.taken_at?.toISOString() ?? null, caption: row.caption,
    subjectType: row.subject_type, subjectId: row.subject_id, ...photoUrls(row.id),
  }
}

const inFlight = new Map<string, Promise<unknown>>()
async function oneAtATime<T>(key: string, work: () => Promise<T>): Promise<T> {
  const run = (inFlight.get(key) ?? Promise.resolve()).catch(() => undefined).then(work)
  inFlight.set(key, run)
  try {
    return await run
  }
  finally {
    if (inFlight.get(key) === run) inFlight.delete(key)
  }
}

const tooLarge = () => createError({ statusCode: 413, statusMessage: `The photo is too large to send (at most ${photoBodyLimit / 1024 / 1024} MB)` })
const notAnImage = () => createError({ statusCode: 415, statusMessage: 'Only JPEG, PNG and WebP photos can be uploaded' })
const unreadable = () => createError({ statusCode: 422, statusMessage: 'The image could not be read' })

function busy(event: H3Event) {
  setResponseHeader(event, 'Retry-After', retryAfterSeconds)
  return createError({
    statusCode: 503,
    statusMessage: 'The server is busy with other photos; this one will be sent again shortly',
    data: { retryAfterSeconds },
  })
}

const storedPhoto = async (id: string) => await useDb()('photos').where({ id }).first<PhotoRow | undefined>()

function sniff(bytes: Buffer): 'jpeg' | 'png' | 'webp' | undefined {
  if (bytes[0] === 0xFF && bytes[1] === 0xD8 && bytes[2] === 0xFF) return 'jpeg'
  if (bytes.readUInt32BE(0) === 0x89504E47) return 'png'
  if (bytes.toString('latin1', 0, 4) === 'RIFF' && bytes.toString('latin1', 8, 12) === 'WEBP') return 'webp'
}

async function processImage(input: Buffer) {
  const format = input.length >= 12 ? sniff(input) : undefined
  if (!format) throw notAnImage()
  // The header alone gives the size: a huge image is refused, with its size, before any pixel is decoded.
  const meta = await sharp(input, { ...sharpInput, limitInputPixels: false }).metadata().catch(() => undefined)
  if (!meta?.width || !meta.height || meta.format !== format) throw unreadable()
  if (meta.width * meta.height > maxInputPixels) {
    throw createError({ statusCode: 422, statusMessage: `The photo is too large to process (${meta.width} × ${meta.height} pixels; at most ${maxInputPixels / 1_000_000} megapixels)` })
  }
  try {
    // rotate() first: the output drops EXIF, and with it the orientation a phone portrait depends on.
    const display = await sharp(input, sharpInput).rotate().flatten({ background: '#ffffff' })
      .resize({ width: photoSizes.display, height: photoSizes.display, fit: 'inside', withoutEnlargement: true })
      .jpeg({ quality: 80, mozjpeg: true }).toBuffer({ resolveWithObject: true })
    const thumb = await sharp(display.data, sharpInput)
      .resize({ width: photoSizes.thumb, height: photoSizes.thumb, fit: 'inside', withoutEnlargement: true })
      .jpeg({ quality: 75, mozjpeg: true }).toBuffer()
    return { display: display.data, thumb, width: display.info.width, height: display.info.height, exif: meta.exif }
  }
  catch {
    throw unreadable()
  }
}

/** When the photo was taken, from EXIF DateTimeOriginal (with OffsetTimeOriginal, else the company's time zone). */
async function exifTakenAt(exif: Buffer | undefined, organisationId: string): Promise<Date | null> {
  const found = exif && exifDateTimeOriginal(exif)
  if (!found) return null
  const wall = new Date(`${found.local}Z`)
  if (Number.isNaN(wall.getTime())) return null
  if (found.offset) return new Date(`${found.local}${found.offset}`)
  const org = await useDb()('organisations').where({ id: organisationId }).first('time_zone')
  // The zone's offset at that wall time, checked once more at the instant found (DST changes).
  const guess = new Date(wall.getTime() - zoneOffsetMs(wall, org?.time_zone))
  return new Date(wall.getTime() - zoneOffsetMs(guess, org?.time_zone))
}

function zoneOffsetMs(at: Date, timeZone = 'UTC'): number {
  const parts = new Intl.DateTimeFormat('en-US', { timeZone, hourCycle: 'h23', year: 'numeric', month: 'numeric', day: 'numeric', hour: 'numeric', minute: 'numeric', second: 'numeric' }).formatToParts(at)
  const part = (type: string) => Number(parts.find(p => p.type === type)?.value)
  return Date.UTC(part('year'), part('month') - 1, part('day'), part('hour'), part('minute'), part('second')) - Math.floor(at.getTime() / 1000) * 1000
}

/** A tiny reader of sharp's raw EXIF ("Exif\0\0" + a TIFF structure): IFD0 → Exif IFD → tags 0x9003, 0x9011. */
function exifDateTimeOriginal(exif: Buffer): { local: string, offset?: string } | undefined {
  const tiff = exif.toString('latin1', 0, 4) === 'Exif' ? exif.subarray(6) : exif
  if (tiff.length < 8) return undefined
  const little = tiff.toString('latin1', 0, 2) === 'II'
  const u16 = (at: number) => at + 2 <= tiff.length ? (little ? tiff.readUInt16LE(at) : tiff.readUInt16BE(at)) : 0
  const u32 = (at: number) => at + 4 <= tiff.length ? (little ? tiff.readUInt32LE(at) : tiff.readUInt32BE(at)) : 0
  const tag = (ifd: number, wanted: number) => {
    for (let i = 0, n = u16(ifd); i < n && i < 500; i++) {
      const entry = ifd + 2 + i * 12
      if (u16(entry) === wanted) return { count: u32(entry + 4), value: u32(entry + 8), inline: entry + 8 }
    }
  }
  const exifIfd = tag(u32(4), 0x8769)?.value
  const ascii = (wanted: number) => {
    const t = exifIfd ? tag(exifIfd, wanted) : undefined
    return t ? tiff.toString('latin1', t.count > 4 ? t.value : t.inline, (t.count > 4 ? t.value : t.inline) + t.count).replace(/\0.*$/s, '') : undefined
  }
  const date = /^(\d{4}):(\d{2}):(\d{2}) (\d{2}):(\d{2}):(\d{2})$/.exec(ascii(0x9003) ?? '')
  if (!date) return undefined
  const offset = /^[+-]\d{2}:\d{2}$/.exec(ascii(0x9011) ?? '')?.[0]
  return { local: `${date[1]}-${date[2]}-${date[3]}T${date[4]}:${date[5]}:${date[6]}`, offset }
}
