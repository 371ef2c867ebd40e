import { uuidParam } from '../../../../shared/schemas/auth'

export default defineEventHandler(async (event) => {
  const member = await requireMember(event, ['office', 'foreman'])
  const { id } = await paramsWith(event, uuidParam)
  return { photos: await jobPhotos(member, id) }
})
