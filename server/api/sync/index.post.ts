export default defineEventHandler(async (event) => {
  // requireMember and the batch checked with the shared schema (the body is checked while the membership is read).
  const request = await readSyncRequest(event)
  const answer = await applyBatch(request)
  setResponseStatus(event, answer.statusCode)
  if (answer.replayed) setResponseHeader(event, 'Idempotent-Replayed', 'true')
  return answer.body
})
