import { describe, expect, it } from 'vitest';
import { clientAddressOf, parseTrustedProxies } from '../../scripts/client-address';

// Which hop of X-Forwarded-For to believe: the rightmost one not added by a trusted proxy
// (MDN "X-Forwarded-For", security and privacy concerns [common practice]; RFC 7239 §5.2 order of hops).
describe('client address for the sign-in limits', () => {
  const none = parseTrustedProxies('');
  const proxy = parseTrustedProxies('10.0.0.5, 10.1.0.0/16, ::1');

  it('uses the socket address and ignores a forwarding header when no proxy is trusted', () => {
    expect(clientAddressOf('127.0.0.2', undefined, none)).toBe('127.0.0.2');
    expect(clientAddressOf('127.0.0.2', '203.0.113.9', none)).toBe('127.0.0.2');
    expect(clientAddressOf('::ffff:127.0.0.3', '203.0.113.9', none)).toBe('127.0.0.3');
  });

  it('believes a trusted proxy, taking the last hop it did not add itself', () => {
    expect(clientAddressOf('10.0.0.5', '198.51.100.7', proxy)).toBe('198.51.100.7');
    // The client put a made-up address first; the proxy appended the real one.
    expect(clientAddressOf('10.0.0.5', '1.2.3.4, 198.51.100.7', proxy)).toBe('198.51.100.7');
    // Two trusted proxies in a row (10.1.x.x forwarded to 10.0.0.5).
    expect(clientAddressOf('10.0.0.5', '198.51.100.7, 10.1.4.4', proxy)).toBe('198.51.100.7');
    expect(clientAddressOf('::1', '2001:db8::1', proxy)).toBe('2001:db8::1');
  });

  it('keeps the proxy address when the header names nothing usable', () => {
    expect(clientAddressOf('10.0.0.5', undefined, proxy)).toBe('10.0.0.5');
    expect(clientAddressOf('10.0.0.5', 'unknown', proxy)).toBe('10.0.0.5');
  });

  it('refuses a setting that is not an address or a range', () => {
    expect(() => parseTrustedProxies('proxy.internal')).toThrow(/TRUSTED_PROXIES/);
    expect(() => parseTrustedProxies('10.0.0.0/x')).toThrow(/TRUSTED_PROXIES/);
  });
});
