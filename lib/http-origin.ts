// Same-origin check for state-changing requests (request forgery from a sibling port or subdomain).
// Browsers send `Origin` on every POST/PUT/PATCH/DELETE they make, fetch or form (Fetch Standard §3.1,
// "origin header"), and `Sec-Fetch-Site` on every request (W3C Fetch Metadata Request Headers §2.1); a page
// cannot set either. OWASP's Cross-Site Request Forgery Prevention Cheat Sheet ("Verifying Origin with
// standard headers", "Fetch Metadata headers") describes the check. A client that sends neither is not a
// browser acting for a signed-in person (curl, a script), which carries no ambient session to abuse.
import { appBaseUrl } from '@/lib/links';

/** Methods that may change something; every other method must not (RFC 9110 §9.2.1, safe methods). */
export const STATE_CHANGING_METHODS: ReadonlySet<string> = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/** The origins of Sowcast's own pages: the public address (NEXTAUTH_URL / APP_BASE_URL). */
export function ownOrigins(env: Record<string, string | undefined> = process.env): Set<string> {
  const origins = new Set<string>();
  for (const url of [env.NEXTAUTH_URL, env.APP_BASE_URL, appBaseUrl()]) {
    if (!url) continue;
    try {
      origins.add(new URL(url).origin);
    } catch {
      // A malformed setting is reported where it is used for links; here it simply matches nothing.
    }
  }
  return origins;
}

/**
 * Why a request must be refused as coming from another site, or null when it may go on. The page's origin
 * must be one of ours, or have the very host (name and port) the request was sent to — a sibling port or
 * subdomain differs in one of them, so "same site" is not enough.
 */
export function crossSiteReason(request: Request, env: Record<string, string | undefined> = process.env): string | null {
  const fetchSite = request.headers.get('sec-fetch-site');
  if (fetchSite === 'cross-site' || fetchSite === 'same-site') return `the browser says it came from a ${fetchSite} page`;
  const origin = request.headers.get('origin');
  if (origin === null) return null;
  if (origin === 'null') return 'it came from a page without an origin (a sandboxed frame or a file)';
  let sent: URL;
  try {
    sent = new URL(origin);
  } catch {
    return 'its Origin header is not an origin';
  }
  if (ownOrigins(env).has(sent.origin)) return null;
  const host = request.headers.get('host');
  if (host !== null && sent.host === host.toLowerCase()) return null;
  return `it came from ${sent.origin}, not from Sowcast's own pages`;
}
