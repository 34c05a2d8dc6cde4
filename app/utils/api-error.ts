/** The message a failed $fetch carries from the server, or a fallback. */
export function apiErrorMessage(error: unknown, fallback: string): string {
  if (error && typeof error === 'object') {
    const data = (error as { data?: { statusMessage?: string, message?: string } }).data
    if (data?.statusMessage) return data.statusMessage
    if (data?.message) return data.message
  }
  return fallback
}

/** The server's per-field messages of a failed $fetch (a 400's `data.issues`), or null when it sent none. */
export function serverFieldErrors(error: unknown): Record<string, string> | null {
  const issues = (error as { data?: { data?: { issues?: { field: string, message: string }[] } } } | null)?.data?.data?.issues
  return issues?.length ? Object.fromEntries(issues.map(i => [i.field, i.message])) : null
}
