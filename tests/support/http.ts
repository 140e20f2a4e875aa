/**
 * An HTTP client for the running test server that signs in the way a browser does
 * (csrf token → credentials callback → session cookie).
 */
export const BASE_URL = process.env.TAKEPROOF_TEST_URL ?? 'http://127.0.0.1:3100';
export const DEMO_PASSWORD = process.env.DEMO_PASSWORD ?? 'demo-takes-2026';

export const DEMO = {
  engineer: 'engineer@demo.test',
  producer: 'producer@demo.test',
  manager: 'manager@demo.test',
  outsider: 'outside-manager@demo.test',
} as const;
export type DemoPerson = keyof typeof DEMO;

export class Client {
  private cookies = new Map<string, string>();

  constructor(private readonly baseUrl: string = BASE_URL) {}

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
    const response = await fetch(this.baseUrl + path, { redirect: 'manual', ...rest, headers, body: json !== undefined ? JSON.stringify(json) : rest.body });
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
