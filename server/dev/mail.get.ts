// Development only (registered with env: 'dev' in nuxt.config.ts): the local mail catcher's messages.
export default defineEventHandler(async (event) => {
  await requireMember(event, ['office'])
  const { mailCatcherUrl } = useRuntimeConfig()
  if (!mailCatcherUrl) throw createError({ statusCode: 503, statusMessage: 'No mail catcher is configured' })
  const messages = await $fetch<unknown[]>(`${mailCatcherUrl}/messages`)
  return { messages: [...messages].reverse() }
})
