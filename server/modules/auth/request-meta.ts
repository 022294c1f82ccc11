import type { Request } from 'express';
import { isIPv6 } from 'node:net';

/** The client's address as Express sees it (honours TRUST_PROXY_HOPS), without the IPv4-mapped prefix. */
export function clientAddress(req: Request): string | null {
  const ip = req.ip ?? req.socket.remoteAddress ?? null;
  if (!ip) return null;
  return ip.startsWith('::ffff:') && ip.includes('.') ? ip.slice(7) : ip;
}

/**
 * The throttling key of an address: IPv4 as is; IPv6 cut to its /56 prefix, since one subscriber usually
 * holds a whole /56 or /64 and could otherwise rotate through it (the default of express-rate-limit 8).
 */
export function addressThrottleKey(ip: string | null): string {
  if (!ip) return 'unknown';
  if (!isIPv6(ip)) return ip;
  const groups = expandIPv6(ip);
  // 56 bits = three full 16-bit groups and the high byte of the fourth.
  return `${groups.slice(0, 3).join(':')}:${groups[3]!.slice(0, 2)}00::/56`;
}

function expandIPv6(ip: string): string[] {
  const [head = '', tail = ''] = ip.split('::') as [string, string?] as [string, string];
  const h = head ? head.split(':') : [];
  const t = ip.includes('::') && tail ? tail.split(':') : [];
  const fill = ip.includes('::') ? Array(8 - h.length - t.length).fill('0') : [];
  return [...h, ...fill, ...t].map((g) => g.padStart(4, '0').toLowerCase());
}

/** Address and browser of a request, as the audit log and the session list record them. */
export function requestMeta(req: Request): { ip: string | null; userAgent: string | null } {
  const ua = req.get('user-agent');
  return { ip: clientAddress(req), userAgent: ua ? ua.slice(0, 400) : null };
}
