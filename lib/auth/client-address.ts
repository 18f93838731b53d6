import { isIP } from 'node:net';

/**
 * Which X-Forwarded-For entry is the client. The web server (scripts/web-server.mjs) appends the socket's peer
 * as the last entry; each proxy in front appends the address it was reached from. With TRUSTED_PROXY_HOPS=0
 * (the default: Sowcast reached directly) the last entry, the socket's peer, is the client and anything a
 * client wrote itself is ignored; with N trusted proxies in front, the entry N places from the right is the
 * address the outermost trusted proxy saw. Entries further left were written by the client and are never used.
 */
export const TRUSTED_PROXY_DEFAULTS = { hops: 0, maxHops: 10 };

export function trustedProxyHops(env: Record<string, string | undefined> = process.env): number {
  const raw = env.TRUSTED_PROXY_HOPS;
  if (raw === undefined || raw.trim() === '') return TRUSTED_PROXY_DEFAULTS.hops;
  const hops = Number(raw);
  if (!Number.isInteger(hops) || hops < 0 || hops > TRUSTED_PROXY_DEFAULTS.maxHops) {
    throw new Error(`TRUSTED_PROXY_HOPS must be a whole number from 0 to ${TRUSTED_PROXY_DEFAULTS.maxHops} (got "${raw}")`);
  }
  return hops;
}

/** The client's address from the X-Forwarded-For the web server completed, or null when there is none. */
export function clientAddress(forwardedFor: string | null | undefined, hops: number): string | null {
  const entries = (forwardedFor ?? '').split(',').map((e) => e.trim()).filter(Boolean);
  if (entries.length === 0) return null;
  // Fewer entries than trusted hops: the request skipped a proxy; the leftmost entry is still one a trusted
  // hop wrote (the web server's own at least).
  const chosen = entries[Math.max(entries.length - 1 - hops, 0)];
  return normalizeAddress(chosen);
}

/** Drops an IPv4-mapped IPv6 prefix and a port; anything not an IP address becomes 'unknown'. */
export function normalizeAddress(value: string): string {
  let address = value.trim();
  const bracketed = /^\[([^\]]+)\](?::\d+)?$/.exec(address);
  if (bracketed) address = bracketed[1];
  else if (/^\d+\.\d+\.\d+\.\d+:\d+$/.test(address)) address = address.replace(/:\d+$/, '');
  if (address.toLowerCase().startsWith('::ffff:') && isIP(address.slice(7)) === 4) address = address.slice(7);
  return isIP(address) ? address.toLowerCase() : 'unknown';
}

/**
 * The key an address is counted under: an IPv4 address as it is, an IPv6 address by its /64 (one subscriber's
 * whole allocation, RFC 6177 §3), so hopping inside one's own prefix does not reset a limit.
 */
export function addressKey(address: string | null): string {
  if (!address || isIP(address) !== 6) return address ?? 'unknown';
  const [head, tail = ''] = address.split('::');
  const left = head ? head.split(':') : [];
  const right = tail ? tail.split(':') : [];
  const groups = address.includes('::') ? [...left, ...Array(8 - left.length - right.length).fill('0'), ...right] : left;
  return `${groups.slice(0, 4).map((g) => parseInt(g || '0', 16).toString(16)).join(':')}::/64`;
}
