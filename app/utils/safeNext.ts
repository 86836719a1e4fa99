/**
 * A ?next= target we are willing to go to: a path on this site only. Anything
 * else ("//elsewhere", "https://...", "/\\elsewhere") would make the sign-in page
 * an open redirect.
 */
export function safeNext(next: unknown, fallback = '/'): string {
  const value = Array.isArray(next) ? next[0] : next
  if (typeof value !== 'string') return fallback
  if (!value.startsWith('/') || value.startsWith('//') || value.startsWith('/\\')) return fallback
  if (value.startsWith('/login') || value.startsWith('/register')) return fallback
  return value
}
