import { snapshotQuery } from '../../../shared/schemas/snapshot'

export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  const query = await queryWith(event, snapshotQuery)
  const refresh = await refreshFor(member, query)
  if (refresh.unchanged) {
    // Nothing changed since the phone's cursor: no body, and the phone keeps what it has.
    setResponseHeaders(event, { 'cache-control': 'no-store' })
    setResponseStatus(event, 304)
    return null
  }
  const { answer } = refresh
  if ('changesSince' in answer) {
    setResponseHeaders(event, { 'cache-control': 'no-store' })
    return answer
  }
  // A full snapshot is revalidated on every request (the phone must see flags and edits made since),
  // but an unchanged one costs a 304: its cursor names its content and the sign-in, so it is the tag.
  const etag = `"${answer.cursor}"`
  setResponseHeaders(event, { 'cache-control': 'private, no-cache', 'etag': etag, 'vary': 'Cookie' })
  if (getRequestHeader(event, 'if-none-match')?.split(',').some(tag => tag.trim() === etag)) {
    setResponseStatus(event, 304)
    return null
  }
  return answer
})
