// A photo upload: PUT /api/photos/:id with the image bytes as the body and what it shows in the query.
// The phone queues photos offline and sends them later, so the id is the phone's own UUID.
import { z } from 'zod'
import { pastMoment } from './dates'

export const photoSubjectTypes = ['day_sheet', 'lift', 'material_drop', 'review_note'] as const
export type PhotoSubjectType = (typeof photoSubjectTypes)[number]

export const photoSizeNames = ['display', 'thumb'] as const
export type PhotoSizeName = (typeof photoSizeNames)[number]

/** The image types the server takes; it also checks the bytes, whatever the Content-Type says. */
export const photoContentTypes = ['image/jpeg', 'image/png', 'image/webp'] as const

// Not strict: a phone may add a cache-busting parameter of its own to a retry.
export const photoUploadQuery = z.object({
  subjectType: z.enum(photoSubjectTypes, 'Choose what the photo shows'),
  subjectId: z.uuid('Not a valid id'),
  caption: z.string().trim().max(255, 'At most 255 characters').optional().transform(c => c || undefined),
  takenAt: pastMoment.optional(),
})

export const photoParams = z.strictObject({ id: z.uuid('Not a valid id') })
export const photoSizeParams = z.strictObject({ id: z.uuid('Not a valid id'), size: z.enum(photoSizeNames) })

export type PhotoUploadQuery = z.infer<typeof photoUploadQuery>

/** What the server answers about a stored photo. */
export interface PhotoRecord {
  id: string
  width: number
  height: number
  takenAt: string | null
  caption: string | null
  subjectType: PhotoSubjectType
  subjectId: string
  thumbUrl: string
  displayUrl: string
}
