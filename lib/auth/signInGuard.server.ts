import 'server-only';
import { AppError } from '@/lib/errors';
import { AttemptLimiter } from './attemptLimiter';

const WINDOW_MS = 15 * 60 * 1000;
// Project defaults: five wrong passwords per account, thirty per client address, per quarter hour.
const perAccount = new AttemptLimiter(Number(process.env.SIGNIN_MAX_FAILURES_PER_ACCOUNT ?? 5), WINDOW_MS);
const perAddress = new AttemptLimiter(Number(process.env.SIGNIN_MAX_FAILURES_PER_ADDRESS ?? 30), WINDOW_MS);

export function clientAddress(request: Request): string {
  return request.headers.get('x-forwarded-for')?.split(',')[0]?.trim() || 'unknown';
}

/** Refuses with 429 (and Retry-After) when the account or the address has failed too often. */
export function assertMayTrySignIn(email: string, address: string): void {
  const wait = Math.max(perAccount.retryAfterSec(email), perAddress.retryAfterSec(address));
  if (wait > 0) {
    throw new AppError('rate_limited:sign_in', `Too many failed sign-ins. Try again in ${Math.ceil(wait / 60)} minute(s).`, {
      // `url` keeps next-auth's browser client working: it reads the error from a sign-in URL.
      extra: { retryAfterSec: wait, url: `${process.env.NEXTAUTH_URL ?? 'http://localhost'}/signin?error=RateLimited` },
    });
  }
}

export function recordSignIn(email: string, address: string, succeeded: boolean): void {
  if (succeeded) {
    perAccount.clear(email);
    return;
  }
  perAccount.fail(email);
  perAddress.fail(address);
}
