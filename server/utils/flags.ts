/** A runtimeConfig switch set from the environment: `1`, `true` or `yes` turn it on. */
export function isOn(value: unknown): boolean {
  return value === true || value === 1 || (typeof value === 'string' && ['1', 'true', 'yes'].includes(value.toLowerCase()))
}

/** 404 unless the switch is on, so a disabled dev or test route looks like no route at all. */
export function requireSwitch(value: unknown): void {
  if (!isOn(value)) throw createError({ statusCode: 404, statusMessage: 'Page not found' })
}

/** The public base URL for absolute links (NUXT_PUBLIC_BASE_URL). */
export function publicBaseUrl(): string {
  return String(useRuntimeConfig().public.baseUrl || 'http://localhost:3000')
}

/** An absolute link for mail and documents: always the configured public base URL, never a request header. */
export function publicLink(path: string): string {
  return `${publicBaseUrl().replace(/\/+$/, '')}${path.startsWith('/') ? path : `/${path}`}`
}
