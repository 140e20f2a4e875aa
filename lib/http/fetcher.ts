import type { ErrorBody, ErrorCode, FieldErrors } from '@/lib/errors';

/** An error answer from Takeproof's API, rebuilt on the client. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode | 'network:offline',
    message: string,
    readonly fields?: FieldErrors,
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

async function toApiError(response: Response): Promise<ApiError> {
  try {
    const body = (await response.json()) as ErrorBody;
    return new ApiError(response.status, body.error, body.message, body.fields);
  } catch {
    return new ApiError(response.status, 'internal:server', `The server answered ${response.status}.`);
  }
}

/** The one client fetcher (SWR and forms): JSON in, JSON out, errors as ApiError. */
export async function fetchJson<T>(url: string, init?: RequestInit & { json?: unknown }): Promise<T> {
  const { json, ...rest } = init ?? {};
  let response: Response;
  try {
    response = await fetch(url, {
      ...rest,
      headers: { Accept: 'application/json', ...(json !== undefined ? { 'Content-Type': 'application/json' } : {}), ...rest.headers },
      body: json !== undefined ? JSON.stringify(json) : rest.body,
    });
  } catch {
    throw new ApiError(0, 'network:offline', 'Takeproof could not be reached. Check the connection and try again.');
  }
  if (!response.ok) throw await toApiError(response);
  if (response.status === 204) return undefined as T;
  return (await response.json()) as T;
}

export const swrFetcher = <T,>(url: string) => fetchJson<T>(url);
