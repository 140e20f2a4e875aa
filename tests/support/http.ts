/**
 * An HTTP client for the running test server that signs in the way a browser does
 * (csrf token → credentials callback → session cookie).
 */
import http from 'node:http';

export const BASE_URL = process.env.TAKEPROOF_TEST_URL ?? 'http://127.0.0.1:3100';
export const DEMO_PASSWORD = process.env.DEMO_PASSWORD ?? 'demo-takes-2026';

export const DEMO = {
  engineer: 'engineer@demo.test',
  producer: 'producer@demo.test',
  manager: 'manager@demo.test',
  outsider: 'outside-manager@demo.test',
} as const;
export type DemoPerson = keyof typeof DEMO;

/**
 * A request sent from a chosen loopback address (127.0.0.2, 127.0.0.3, …), the way a client on
 * another machine reaches the server with an address of its own; answered as a fetch Response.
 */
function fetchFrom(localAddress: string, url: string, init: RequestInit): Promise<Response> {
  if (init.body !== undefined && init.body !== null && typeof init.body !== 'string') throw new Error('fetchFrom sends text bodies only');
  return new Promise((resolve, reject) => {
    const request = http.request(url, { method: init.method ?? 'GET', headers: Object.fromEntries(new Headers(init.headers)), localAddress, agent: false }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('error', reject);
      res.on('end', () => {
        const headers = new Headers();
        for (const [name, value] of Object.entries(res.headers)) for (const v of [value ?? []].flat()) headers.append(name, v);
        const status = res.statusCode ?? 0;
        resolve(new Response([204, 304].includes(status) ? null : Buffer.concat(chunks), { status, headers }));
      });
    });
    request.on('error', reject);
    request.end(init.body ?? undefined);
  });
}

export class Client {
  private cookies = new Map<string, string>();

  /** `localAddress`: send every request from this loopback address instead of the default one. */
  constructor(
    private readonly baseUrl: string = BASE_URL,
    private readonly localAddress?: string,
  ) {}

  cookieHeader() {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  private keepCookies(response: Response) {
    for (const line of response.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const eq = pair.indexOf('=');
      this.cookies.set(pair.slice(0, eq).trim(), pair.slice(eq + 1).trim());
    }
  }

  /** Like a browser, names the page's origin on every request that changes data (unless the test sets its own). */
  async fetch(path: string, init: RequestInit & { json?: unknown } = {}): Promise<Response> {
    const { json, ...rest } = init;
    const headers = new Headers(rest.headers);
    if (this.cookies.size) headers.set('cookie', this.cookieHeader());
    if (!['GET', 'HEAD'].includes((rest.method ?? 'GET').toUpperCase()) && !headers.has('origin')) headers.set('origin', new URL(this.baseUrl).origin);
    if (json !== undefined) headers.set('content-type', 'application/json');
    const request = { redirect: 'manual' as const, ...rest, headers, body: json !== undefined ? JSON.stringify(json) : rest.body };
    const response = this.localAddress ? await fetchFrom(this.localAddress, this.baseUrl + path, request) : await fetch(this.baseUrl + path, request);
    this.keepCookies(response);
    return response;
  }

  /** Signs in; returns the credentials callback's response. */
  async signIn(email: string, password = DEMO_PASSWORD): Promise<Response> {
    const { csrfToken } = (await (await this.fetch('/api/auth/csrf')).json()) as { csrfToken: string };
    return this.fetch('/api/auth/callback/credentials', {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ csrfToken, email, password, json: 'true' }).toString(),
    });
  }

  hasSession(): boolean {
    return [...this.cookies.keys()].some((k) => k.endsWith('next-auth.session-token'));
  }
}

/** A client signed in as one of the demo people. */
export async function signedIn(person: DemoPerson): Promise<Client> {
  const client = new Client();
  await client.signIn(DEMO[person]);
  if (!client.hasSession()) throw new Error(`Could not sign in as ${DEMO[person]}`);
  return client;
}

export async function signedInAll(): Promise<Record<DemoPerson | 'anonymous', Client>> {
  const [engineer, producer, manager, outsider] = await Promise.all([signedIn('engineer'), signedIn('producer'), signedIn('manager'), signedIn('outsider')]);
  return { anonymous: new Client(), engineer, producer, manager, outsider };
}
