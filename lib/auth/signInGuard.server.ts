import 'server-only';
import { Op } from 'sequelize';
import { ensureDb } from '@/lib/db/connection.server';
import { AppError } from '@/lib/errors';
import { SignInFailure } from '@/models';
import { retryAfterSec, type Allowance } from './attemptLimiter';

const WINDOW_MS = 15 * 60 * 1000;
const allowance = (variable: string | undefined, fallback: number): Allowance => ({ max: Number(variable ?? fallback), windowMs: WINDOW_MS });
// Project defaults per quarter hour: five wrong passwords for one account from one address, thirty
// from one address, a hundred for one account from everywhere. Someone guessing from their own
// address cannot lock the account's owner out at another address.
const PER_ACCOUNT_AT_ADDRESS = allowance(process.env.SIGNIN_MAX_FAILURES_PER_ACCOUNT, 5);
const PER_ADDRESS = allowance(process.env.SIGNIN_MAX_FAILURES_PER_ADDRESS, 30);
const PER_ACCOUNT = allowance(process.env.SIGNIN_MAX_FAILURES_PER_ACCOUNT_ANYWHERE, 100);

/**
 * The header in which scripts/web-server.ts passes the client's address: the socket's remote
 * address, or the address a proxy named in TRUSTED_PROXIES forwarded. A client cannot set it.
 */
const CLIENT_ADDRESS_HEADER = 'x-takeproof-client-address';

/** The client's address, from request headers as a Request or as next-auth's plain object. */
export function clientAddress(headers: Headers | Record<string, string | string[] | undefined>): string {
  const value = headers instanceof Headers ? headers.get(CLIENT_ADDRESS_HEADER) : headers[CLIENT_ADDRESS_HEADER];
  if (typeof value !== 'string' || !value) throw new Error('The client address is missing: run the web app through scripts/web-server.ts.');
  return value.slice(0, 64);
}

/** The account an attempt names, as sign-in compares it. */
export function accountOf(email: unknown): string {
  return typeof email === 'string' ? email.trim().toLowerCase().slice(0, 254) : '';
}

/** Refuses with 429 (and Retry-After) when the account, the address, or the account at this address has failed too often. */
export async function assertMayTrySignIn(email: string, address: string): Promise<void> {
  ensureDb();
  const now = Date.now();
  const failures = await SignInFailure.findAll({
    where: { failedAt: { [Op.gt]: new Date(now - WINDOW_MS) }, [Op.or]: [{ address }, ...(email ? [{ email }] : [])] },
    attributes: ['email', 'address', 'failedAt'],
  });
  const times = (keep: (f: SignInFailure) => boolean) => failures.filter(keep).map((f) => f.failedAt.getTime());
  const wait = Math.max(
    retryAfterSec(times((f) => f.email === email && f.address === address), PER_ACCOUNT_AT_ADDRESS, now),
    retryAfterSec(times((f) => f.address === address), PER_ADDRESS, now),
    email ? retryAfterSec(times((f) => f.email === email), PER_ACCOUNT, now) : 0,
  );
  if (wait > 0) {
    throw new AppError('rate_limited:sign_in', `Too many failed sign-ins. Try again in ${Math.ceil(wait / 60)} minute(s).`, {
      // `url` keeps next-auth's browser client working: it reads the error from a sign-in URL.
      extra: { retryAfterSec: wait, url: `${process.env.NEXTAUTH_URL ?? 'http://localhost'}/signin?error=RateLimited` },
    });
  }
}

/**
 * Records the outcome of a password that was really checked. A failure counts against the account
 * and the address; only a real success clears the account's failures from this address.
 */
export async function recordSignIn(email: string, address: string, succeeded: boolean): Promise<void> {
  ensureDb();
  if (succeeded) {
    await SignInFailure.destroy({ where: { email, address } });
    return;
  }
  await SignInFailure.create({ email, address, failedAt: new Date() });
  await SignInFailure.destroy({ where: { failedAt: { [Op.lt]: new Date(Date.now() - WINDOW_MS) } } });
}
