// Which push endpoints Sowcast will connect to. A subscription's endpoint is a URL the browser hands over,
// and the worker POSTs to it: left unchecked, anyone signed in could make the worker reach loopback, the
// local network or a cloud metadata address (server-side request forgery, OWASP SSRF Prevention Cheat
// Sheet: "resolve the domain and check every IP address against private ranges"). Real push services are
// public https hosts (RFC 8030 §5, RFC 8292). Only addresses ipaddr.js classifies as plain public 'unicast'
// pass: loopback, RFC 1918 private, link-local, unique-local (fc00::/7), CGNAT (100.64/10), multicast,
// reserved, documentation and the IPv6 forms that embed an IPv4 address (mapped, 6to4, Teredo, NAT64) do not.
// The local fake push service is let through only when its origin is listed in PUSH_ENDPOINT_ALLOWED_ORIGINS.
import dns from 'node:dns';
import https from 'node:https';
import type { LookupFunction } from 'node:net';
import ipaddr from 'ipaddr.js';

export class PushEndpointRefused extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'PushEndpointRefused';
  }
}

export type Environment = Record<string, string | undefined>;

/** The origins let through without the public-address rule (the local fake), from a comma-separated list. */
export function allowedPushOrigins(env: Environment = process.env): Set<string> {
  const origins = new Set<string>();
  for (const item of (env.PUSH_ENDPOINT_ALLOWED_ORIGINS ?? '').split(',')) {
    const trimmed = item.trim();
    if (!trimmed) continue;
    try {
      origins.add(new URL(trimmed).origin);
    } catch {
      throw new Error(`PUSH_ENDPOINT_ALLOWED_ORIGINS holds "${trimmed}", which is not a URL`);
    }
  }
  return origins;
}

/** Why an address may not be connected to, or null when it is a public unicast address. */
export function addressRefusal(address: string): string | null {
  if (!ipaddr.isValid(address)) return `${address} is not an IP address`;
  let parsed = ipaddr.parse(address);
  if (parsed.kind() === 'ipv6' && (parsed as ipaddr.IPv6).isIPv4MappedAddress()) parsed = (parsed as ipaddr.IPv6).toIPv4Address();
  const range = parsed.range();
  return range === 'unicast' ? null : `${address} is a ${range} address, not a public one`;
}

type Resolve = (hostname: string) => Promise<string[]>;

const resolveAll: Resolve = async (hostname) => (await dns.promises.lookup(hostname, { all: true, verbatim: true })).map((a) => a.address);

/**
 * Refuses (PushEndpointRefused) an endpoint that is not https, carries credentials, or whose host is or
 * resolves to any address that is not public; an origin on the allow-list passes as it is.
 */
export async function checkPushEndpoint(endpoint: string, env: Environment = process.env, resolve: Resolve = resolveAll): Promise<void> {
  let url: URL;
  try {
    url = new URL(endpoint);
  } catch {
    throw new PushEndpointRefused('Endpoint must be an https URL');
  }
  if (url.protocol !== 'https:') throw new PushEndpointRefused('Endpoint must be an https URL');
  if (url.username || url.password) throw new PushEndpointRefused('Endpoint must not carry a user name or password');
  if (allowedPushOrigins(env).has(url.origin)) return;
  const host = url.hostname.replace(/^\[|\]$/g, '');
  let addresses: string[];
  if (ipaddr.isValid(host)) addresses = [host];
  else {
    try {
      addresses = await resolve(host);
    } catch {
      throw new PushEndpointRefused(`Endpoint host ${host} could not be found`);
    }
  }
  if (!addresses.length) throw new PushEndpointRefused(`Endpoint host ${host} could not be found`);
  for (const address of addresses) {
    const refusal = addressRefusal(address);
    if (refusal) throw new PushEndpointRefused(`Endpoint must be a public push service: ${host} → ${refusal}`);
  }
}

/**
 * A DNS lookup for the sending connection that refuses non-public answers, so a name that changes between
 * the check and the connection (DNS rebinding) still cannot reach a private address.
 */
const publicOnlyLookup: LookupFunction = (hostname, options, callback) => {
  const allowedHosts = new Set([...allowedPushOrigins()].map((origin) => new URL(origin).hostname));
  dns.lookup(hostname, { ...options, all: true }, (error, addresses) => {
    if (error) return callback(error, '', 4);
    const list = addresses as dns.LookupAddress[];
    const refused = allowedHosts.has(hostname) ? undefined : list.map((a) => addressRefusal(a.address)).find(Boolean);
    if (refused || !list.length) {
      return callback(Object.assign(new Error(`push endpoint refused: ${hostname} → ${refused ?? 'no address'}`), { code: 'EPUSHREFUSED' }), '', 4);
    }
    if (options.all) return (callback as unknown as (e: null, a: dns.LookupAddress[]) => void)(null, list);
    callback(null, list[0].address, list[0].family);
  });
};

let agent: https.Agent | null = null;

/**
 * The worker's agent for push requests: the lookup above, and a fresh connection per request as web-push makes
 * by default. A kept-alive socket that the push service has closed while idle fails the next send with "socket
 * hang up" (seen in the two-worker test), which would delay a reminder to its retry.
 */
export function pushAgent(): https.Agent {
  agent ??= new https.Agent({ keepAlive: false, lookup: publicOnlyLookup });
  return agent;
}
