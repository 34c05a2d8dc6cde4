/**
 * Stops a page whose main resource failed to load and shows the error page with the server's
 * status (404 for a tank the person may not see). Call it right after the page's awaited fetch.
 */
export function failPageOn(error: { statusCode?: number, statusMessage?: string } | null | undefined): void {
  if (error) throw createError({ statusCode: error.statusCode ?? 500, statusMessage: error.statusMessage, fatal: true })
}
