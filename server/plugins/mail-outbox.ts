// Every NUXT_REPORTS_INTERVAL_SECONDS: queue what is due, then send what is queued. Errors are logged
// and the next tick tries again; a tick never overlaps the one before. 0 turns the timer off.
export default defineNitroPlugin((nitro) => {
  const settings = outboxSettings()
  if (!(settings.intervalSeconds > 0)) return
  let running = false
  let lastError = ''
  const tick = async () => {
    if (running) return
    running = true
    try {
      await queueDueMail(settings)
      await sendDueMail(settings)
      await sendQueuedMessages(settings)
      lastError = ''
    }
    catch (error) {
      const message = error instanceof Error ? error.message : String(error)
      // Once per kind of trouble (a database that is down would otherwise log every tick).
      if (message !== lastError) console.error(`[mail outbox] ${message}`)
      lastError = message
    }
    finally {
      running = false
    }
  }
  const timer = setInterval(tick, settings.intervalSeconds * 1000)
  timer.unref()
  nitro.hooks.hook('close', () => clearInterval(timer))
})
