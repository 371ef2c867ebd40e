// Pages behind a sign-in send the visitor to it, with the way back in ?redirect=.
// The server checks the session again on every API route.
export default defineNuxtRouteMiddleware((to) => {
  const { loggedIn } = useUserSession()
  if (!loggedIn.value) return navigateTo({ path: '/sign-in', query: { redirect: to.fullPath } })
})
