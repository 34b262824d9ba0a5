// The two small cookies the screens keep for the tablet (its theme and its language), read and
// written without a cookie library: the server renders with them on the first paint, and only
// the browser ever changes them.

/** A cookie's value in a `Cookie` header (or `document.cookie`). */
export function cookieIn(header: string | undefined | null, name: string): string | undefined {
  const m = header?.match(new RegExp(`(?:^|;\\s*)${name}=([^;]*)`))
  if (!m) return undefined
  try { return decodeURIComponent(m[1]!) }
  catch { return undefined }
}

/** The cookie a request came with on the server, or the browser's own. */
export function startingCookie(name: string): string | undefined {
  return cookieIn(import.meta.server ? useRequestHeaders(['cookie']).cookie : document.cookie, name)
}

/** Kept by the browser for a year, sent with every page request (not readable across sites). */
export function rememberInCookie(name: string, value: string) {
  document.cookie = `${name}=${encodeURIComponent(value)}; path=/; max-age=31536000; samesite=lax`
}
