// The session cookie is Secure when the app is served over HTTPS (directly or behind a proxy that says
// so in X-Forwarded-Proto). nuxt-auth-utils takes one static cookie config, so on plain HTTP (a phone on
// the yard's Wi-Fi hitting a laptop, local development) the Secure attribute is dropped here.
export default defineEventHandler((event) => {
  if (getRequestProtocol(event, { xForwardedProto: true }) === 'https') return
  const res = event.node.res
  const setHeader = res.setHeader.bind(res)
  res.setHeader = (name, value) => {
    if (name.toLowerCase() !== 'set-cookie') return setHeader(name, value)
    const strip = (cookie: string) => cookie.replace(/;\s*Secure/gi, '')
    return setHeader(name, Array.isArray(value) ? value.map(strip) : typeof value === 'string' ? strip(value) : value)
  }
})
