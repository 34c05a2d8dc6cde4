// Nuxt's data-fetching composables (useAsyncData, useFetch and the ohash they key requests
// with) are reached from the app's entry through the `#app` index that @pinia/nuxt's plugin
// imports. Their top-level factory calls look like side effects to Rollup, so it kept them in
// the entry script every page loads, the sign-in page included, which fetches nothing. Marked
// free of side effects, they go where they are used: the chunks of the pages that fetch.
const SIDE_EFFECT_FREE = [
  '/nuxt/dist/app/composables/asyncData.',
  '/nuxt/dist/app/composables/fetch.',
]

/** Rollup `treeshake.moduleSideEffects` for the browser build. */
export function moduleSideEffects(id) {
  return !SIDE_EFFECT_FREE.some(part => id.includes(part))
}
