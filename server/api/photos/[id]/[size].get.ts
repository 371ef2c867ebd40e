import { photoSizeParams } from '../../../../shared/schemas/photos'

export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  const { id, size } = await paramsWith(event, photoSizeParams)
  return sendPhoto(event, await readPhoto(member, id, size))
})
