// The screens speak the language the person chose in their profile (kept in the session, and on the
// phone through i18n's cookie, so it holds offline too). Runs after session-offline.client.ts, which
// may have restored the user from the phone's cache.
export default defineNuxtPlugin((nuxtApp) => {
  const { user } = useUserSession()
  watch(() => user.value?.locale, (locale) => {
    if (locale && locale !== nuxtApp.$i18n.locale.value) void nuxtApp.$i18n.setLocale(locale)
  }, { immediate: true })
})
