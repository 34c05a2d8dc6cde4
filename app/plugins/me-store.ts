import { useMeStore } from '~/stores/me'

/** Keeps the signed-in person's store in step with the session: on the server, after sign-in and after sign-out. */
export default defineNuxtPlugin(() => {
  const { user } = useUserSession()
  const me = useMeStore()
  watch(user, value => me.setPerson(value), { immediate: true })
})
