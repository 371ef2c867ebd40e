// Pages that list `roles` in definePageMeta open only for those roles. Use after 'auth'.
// The server makes the same check: this only spares the user a page of errors.
export default defineNuxtRouteMiddleware((to) => {
  const allowed = to.meta.roles
  if (!allowed?.length) return
  const { user } = useUserSession()
  if (user.value && !allowed.includes(user.value.role)) {
    // fatal: on a client-side navigation a non-fatal error only cancels it, and the tap seems to do nothing.
    return abortNavigation(createError({ status: 403, statusText: 'Your role cannot open this page', fatal: true }))
  }
})
