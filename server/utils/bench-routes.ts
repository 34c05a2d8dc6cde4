/**
 * Benchmark floor routes (server/api/bench/) exist only when the server is started with
 * NUXT_BENCH_ROUTES=1; otherwise they answer exactly like a path no route declares.
 */
export function requireBenchRoutes(): void {
  if (!useRuntimeConfig().benchRoutes) throw createError({ statusCode: 404, statusMessage: 'No such API route' })
}
