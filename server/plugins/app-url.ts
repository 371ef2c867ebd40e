// Without NUXT_APP_URL the server cannot make links for e-mail (server/utils/app-origin.ts): say so
// once at start, rather than only when somebody asks for a password reset.
export default defineNitroPlugin(() => {
  if (configuredAppUrl()) return
  console.warn('[tamp] NUXT_APP_URL is not set (or not an http(s) address): password-reset and invitation e-mails are refused with 503 until it is.')
})
