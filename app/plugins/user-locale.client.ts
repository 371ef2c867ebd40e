// The screens speak the language the person chose in their profile (kept in the session, and on the
// phone through i18n's cookie, so it holds offline too). Runs after session-offline.client.ts, which
// may have restored the user from the phone's cache.
export default defineNuxtPlugin({
  name: 'tamp-user-locale',
  setup(nuxtApp) {
    const { user } = useUserSession()
    const i18n = nuxtApp.$i18n as { locale: Ref<string>, setLocale: (locale: 'en' | 'es') => Promise<void> }
    watch(() => user.value?.locale, (locale) => {
      if (locale && locale !== i18n.locale.value) void i18n.setLocale(locale)
    }, { immediate: true })
  },
})
