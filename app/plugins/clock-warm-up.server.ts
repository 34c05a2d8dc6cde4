import { CLOCK_LOCALE } from '#shared/readings/reader-words'

/**
 * A signed-in page prints dates while it hydrates, and a browser's first `Intl` formatter of a
 * page costs it 10-30 ms (its locale data is loaded then; later formatters take under 1 ms).
 * Made by a line at the end of the page, that first one is paid while the page's scripts are
 * still arriving, instead of inside hydration's one long task. The sign-in page prints none.
 */
export default defineNuxtPlugin(() => {
  if (!useUserSession().loggedIn.value) return
  useHead({ script: [{ innerHTML: `new Intl.DateTimeFormat(${JSON.stringify(CLOCK_LOCALE)}).format(0)`, tagPosition: 'bodyClose' }] })
})
