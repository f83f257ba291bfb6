// Sends signed-out people to the sign-in page. Convenience only: the server checks every request itself.
const PUBLIC = [/^\/$/, /^\/login/, /^\/register/, /^\/forgot/, /^\/reset\//, /^\/invitations\//, /^\/handbook/]

export default defineNuxtRouteMiddleware((to) => {
  const { loggedIn } = useUserSession()
  if (loggedIn.value || PUBLIC.some(p => p.test(to.path))) return
  return navigateTo({ path: '/login', query: { next: to.fullPath } })
})
