// Sends signed-out visitors to the sign-in page. A convenience only: every API route checks the
// session and the lab role itself.
const OPEN = [/^\/login$/, /^\/register$/, /^\/forgot$/, /^\/reset\//, /^\/invite\//, /^\/dev\//]

export default defineNuxtRouteMiddleware((to) => {
  if (OPEN.some(re => re.test(to.path))) return
  const { loggedIn } = useUserSession()
  if (!loggedIn.value) return navigateTo({ path: '/login', query: to.fullPath !== '/' ? { next: to.fullPath } : {} })
})
