// The database's state, and what the photo route is busy with (uploads being received, decoding, waiting).
export default defineEventHandler(async (event) => {
  const uploads = uploadLoad()
  if (await databaseAnswers()) return { ok: true, uploads }
  setResponseStatus(event, 503)
  return { ok: false, reason: 'database unreachable', uploads }
})
