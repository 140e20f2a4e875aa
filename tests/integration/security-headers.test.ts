import { describe, expect, it } from 'vitest';
import { Client, signedIn } from '../support/http';

// Response headers every page and API answer carries (OWASP secure-headers recommendations [common practice]).
function expectSecurityHeaders(response: Response) {
  const csp = response.headers.get('content-security-policy') ?? '';
  expect(csp).toContain("default-src 'self'");
  expect(csp).toContain("frame-ancestors 'none'");
  expect(csp).toContain("object-src 'none'");
  expect(response.headers.get('x-content-type-options')).toBe('nosniff');
  expect(response.headers.get('referrer-policy')).toBe('same-origin');
  expect(response.headers.get('x-powered-by')).toBeNull();
}

describe('security headers', () => {
  it('are on the sign-in page, signed-in pages, API answers and error answers', async () => {
    const anonymous = new Client();
    expectSecurityHeaders(await anonymous.fetch('/signin'));
    expectSecurityHeaders(await anonymous.fetch('/api/sessions'));
    const manager = await signedIn('manager');
    expectSecurityHeaders(await manager.fetch('/sessions'));
    expectSecurityHeaders(await manager.fetch('/api/sessions'));
    expectSecurityHeaders(await manager.fetch('/api/sessions/999999'));
    // Static files from public/ too (the browser tab's mark).
    const icon = await anonymous.fetch('/takeproof-mark.svg');
    expect(icon.status).toBe(200);
    expect(icon.headers.get('content-type')).toMatch(/image\/svg\+xml/);
    expectSecurityHeaders(icon);
  });

  it('never answers an API error with a stack trace', async () => {
    const manager = await signedIn('manager');
    const response = await manager.fetch('/api/sessions', { method: 'POST', headers: { 'content-type': 'application/json' }, body: '[1,2' });
    const text = await response.text();
    expect(response.status).toBe(400);
    expect(text).not.toMatch(/at .*:\d+:\d+/);
    expect(JSON.parse(text)).toEqual({ error: 'invalid:json', message: 'The request body is not valid JSON.' });
  });
});
