/** "5 min ago", "3 h ago", "2 days ago" — short relative times for lists. */
export function timeAgo(iso: string, now = Date.now()): string {
  const minutes = Math.max(0, Math.round((now - Date.parse(iso)) / 60_000))
  return minutes < 1 ? 'just now' : `${ageWords(minutes)} ago`
}

/** An age in minutes as short words. */
export function ageWords(minutes: number): string {
  if (minutes < 1) return 'just now'
  if (minutes < 60) return `${minutes} min`
  const hours = Math.round(minutes / 60)
  if (hours < 48) return `${hours} h`
  return `${Math.round(hours / 24)} days`
}
