// Signed-out visitors go to the sign-in page; signed-in users skip it.
export default defineNuxtRouteMiddleware((to) => {
  const { loggedIn } = useUserSession()
  const isPublic = to.meta.public === true
  if (!loggedIn.value && !isPublic) return navigateTo({ path: '/login', query: to.fullPath !== '/' ? { next: to.fullPath } : {} })
  if (loggedIn.value && to.path === '/login') return navigateTo('/')
})
