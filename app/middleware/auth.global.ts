import { allowsRole } from '~/utils/page-access'

// Signed-out visitors go to the sign-in page; signed-in users skip it. A page that names its
// roles in route meta (`definePageMeta({ roles: ['admin'] })`) answers anyone else with 403.
export default defineNuxtRouteMiddleware((to) => {
  const { loggedIn, user } = useUserSession()
  const isPublic = to.meta.public === true
  if (!loggedIn.value && !isPublic) return navigateTo({ path: '/login', query: to.fullPath !== '/' ? { next: to.fullPath } : {} })
  if (loggedIn.value && to.path === '/login') return navigateTo('/')
  if (!allowsRole(to.meta.roles, user.value?.role)) {
    return abortNavigation(createError({ statusCode: 403, statusMessage: 'This page is not open to your account', fatal: true }))
  }
})
