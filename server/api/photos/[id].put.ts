import { photoParams, photoUploadQuery } from '../../../shared/schemas/photos'

// The phone's outbox sends each photo here once it is online: the image bytes as the body, what it shows in the query.
export default defineEventHandler(async (event) => {
  const member = await requireMember(event, ['crew_lead', 'foreman', 'office'])
  const { id } = await paramsWith(event, photoParams)
  const query = await queryWith(event, photoUploadQuery)
  const { status, photo } = await ingestPhoto(event, member, id, query)
  setResponseStatus(event, status)
  return { photo }
})
