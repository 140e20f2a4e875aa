import { BlockList, isIP } from 'node:net';

/**
 * Which address a request comes from, for the sign-in limits. The socket's remote address is
 * trusted; a forwarding header only when the socket is a proxy named in TRUSTED_PROXIES
 * (comma-separated addresses or CIDR ranges, e.g. `10.0.0.5, 10.1.0.0/16, ::1`).
 */
export interface TrustedProxies {
  has(address: string): boolean;
}

/** `::ffff:127.0.0.1` (an IPv4 client on an IPv6 socket) is 127.0.0.1. */
function plain(address: string): string {
  const trimmed = address.trim();
  return /^::ffff:\d+\.\d+\.\d+\.\d+$/i.test(trimmed) ? trimmed.slice(7) : trimmed;
}

export function parseTrustedProxies(setting: string): TrustedProxies {
  const list = new BlockList();
  for (const entry of setting.split(/[\s,]+/).filter(Boolean)) {
    const [address, prefix] = entry.split('/');
    const family = isIP(address) === 6 ? 'ipv6' : 'ipv4';
    if (!isIP(address) || (prefix !== undefined && !/^\d{1,3}$/.test(prefix))) throw new Error(`TRUSTED_PROXIES: “${entry}” is not an address or a CIDR range`);
    if (prefix === undefined) list.addAddress(address, family);
    else list.addSubnet(address, Number(prefix), family);
  }
  return { has: (address) => isIP(address) !== 0 && list.check(address, isIP(address) === 6 ? 'ipv6' : 'ipv4') };
}

/**
 * The client's address: the socket's peer, or, while the peer is a trusted proxy, the hop that
 * proxy names last in X-Forwarded-For (right to left, RFC 7239 §5.2's order of hops).
 */
export function clientAddressOf(peer: string, forwardedFor: string | undefined, trusted: TrustedProxies): string {
  let address = plain(peer);
  const hops = (forwardedFor ?? '').split(',').map(plain).filter(Boolean);
  while (trusted.has(address) && hops.length) {
    const hop = hops.pop()!;
    if (!isIP(hop)) break;
    address = hop;
  }
  return address;
}
