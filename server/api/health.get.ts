export default defineEventHandler(async (event) => {
  if (await databaseAnswers()) return { ok: true }
  setResponseStatus(event, 503)
  return { ok: false, reason: 'database unreachable' }
})
