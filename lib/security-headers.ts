// The response headers that tell a browser how to treat Sowcast's pages and answers. Sources:
// W3C Content Security Policy Level 3 (nonces, 'strict-dynamic', frame-ancestors); Next.js's CSP guide
// (a nonce per request, set in the proxy, which Next reads from the request's Content-Security-Policy
// header and puts on its own scripts); OWASP HTTP Headers Cheat Sheet (nosniff, Referrer-Policy,
// Permissions-Policy); RFC 6797 (HSTS, only over https). Static headers for every path are in
// next.config.mjs; this module holds the ones that change per request or with the public address.

/** 'unsafe-inline' for styles: FullCalendar and recharts set style attributes, which nonces cannot cover. */
export function pageContentSecurityPolicy(nonce: string, options: { development: boolean; https: boolean }): string {
  return [
    "default-src 'self'",
    // 'strict-dynamic': scripts Next's nonced scripts load are trusted; 'self' is the CSP2 fallback.
    `script-src 'self' 'nonce-${nonce}' 'strict-dynamic'${options.development ? " 'unsafe-eval'" : ''}`,
    "style-src 'self' 'unsafe-inline'",
    // Photos, thumbnails and uploads come from our own API; blob: and data: for previews before upload.
    "img-src 'self' blob: data:",
    // FullCalendar's stylesheet carries its small icon font as a data: URL.
    "font-src 'self' data:",
    "connect-src 'self'",
    "worker-src 'self'",
    "manifest-src 'self'",
    "object-src 'none'",
    "base-uri 'self'",
    "form-action 'self'",
    "frame-ancestors 'none'",
    ...(options.https ? ['upgrade-insecure-requests'] : []),
  ].join('; ');
}

/** JSON, CSV, iCalendar and stored files are never documents to run or frame. */
export const API_CONTENT_SECURITY_POLICY = "default-src 'none'; frame-ancestors 'none'; sandbox";

/** Two years, with subdomains (RFC 6797 §6.1; OWASP HTTP Strict Transport Security Cheat Sheet). */
export const STRICT_TRANSPORT_SECURITY = 'max-age=63072000; includeSubDomains';

/** The public address is https: NEXTAUTH_URL / APP_BASE_URL, as the rest of the app reads it. */
export function publicUrlIsHttps(env: Record<string, string | undefined> = process.env): boolean {
  return (env.APP_BASE_URL ?? env.NEXTAUTH_URL ?? '').startsWith('https://');
}

/** Adds the per-response headers of an API answer (the static ones come from next.config.mjs). */
export function withApiSecurityHeaders(response: Response): Response {
  try {
    if (!response.headers.has('content-security-policy')) response.headers.set('Content-Security-Policy', API_CONTENT_SECURITY_POLICY);
    if (publicUrlIsHttps()) response.headers.set('Strict-Transport-Security', STRICT_TRANSPORT_SECURITY);
  } catch {
    // A response with immutable headers (a fetched one passed through) keeps what it has.
  }
  return response;
}
