import { createHash } from 'node:crypto'

export default defineEventHandler(async (event) => {
  const member = await requireMember(event)
  const snapshot = await snapshotFor(member)
  // Revalidated on every refresh (the phone must see flags and edits made since its last visit), but
  // a snapshot that has not changed costs a 304 and no body: the browser answers the page's fetch
  // from its own copy. The tag covers everything but the time it was made, and is the member's own.
  const { fetchedAt: _, ...content } = snapshot
  const etag = `"${createHash('sha256').update(member.userId).update(member.organisationId).update(JSON.stringify(content)).digest('base64url').slice(0, 32)}"`
  setResponseHeaders(event, { 'cache-control': 'private, no-cache', 'etag': etag, 'vary': 'Cookie' })
  if (getRequestHeader(event, 'if-none-match')?.split(',').some(tag => tag.trim() === etag)) {
    setResponseStatus(event, 304)
    return null
  }
  return snapshot
})
