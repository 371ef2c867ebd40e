export default defineEventHandler(async (event) => {
  // The session and the batch checked with the shared schema; the membership is read with the batch's
  // context and confirmed before anything is decided.
  const request = await readSyncRequest(event)
  const answer = await applyBatch(request)
  setResponseStatus(event, answer.statusCode)
  if (answer.replayed) setResponseHeader(event, 'Idempotent-Replayed', 'true')
  return answer.body
})
