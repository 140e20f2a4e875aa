import 'server-only';

const CONNECTION_ERRORS = new Set(['SequelizeConnectionError', 'SequelizeConnectionRefusedError', 'SequelizeConnectionAcquireTimeoutError', 'SequelizeHostNotReachableError', 'SequelizeConnectionTimedOutError']);

/**
 * True when an error means MariaDB cannot be reached (stopped, restarting, connection cut),
 * as opposed to a query that MariaDB answered with an error.
 */
export function isDatabaseDown(error: unknown): boolean {
  const e = error as { name?: string; parent?: { fatal?: boolean; code?: string } } | null;
  if (!e) return false;
  if (CONNECTION_ERRORS.has(e.name ?? '')) return true;
  // A query cut off by the server going away: the driver marks the connection error fatal.
  return e.name === 'SequelizeDatabaseError' && (e.parent?.fatal === true || e.parent?.code === 'ECONNRESET');
}

const FIRST_WAIT_MS = 500;
const LONGEST_WAIT_MS = 5_000;

/** The wait before try `attempt` (1-based): doubling from half a second, at most five seconds. */
export function databaseBackoffMs(attempt: number): number {
  return Math.min(LONGEST_WAIT_MS, FIRST_WAIT_MS * 2 ** Math.max(0, attempt - 1));
}

/**
 * Runs `work`, and while the database cannot be reached waits (with backoff) and runs it again,
 * for as long as it takes. Any other error is thrown at once. `what` names the work in the log.
 */
export async function untilDatabaseAnswers<T>(what: string, work: () => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      const result = await work();
      if (attempt > 1) console.log(`The database answers again; ${what} done.`);
      return result;
    } catch (error) {
      if (!isDatabaseDown(error)) throw error;
      const wait = databaseBackoffMs(attempt);
      if (attempt === 1 || attempt % 10 === 0) console.warn(`The database cannot be reached (${(error as Error).message}); ${what} is tried again in ${wait / 1000} s and after.`);
      await new Promise((resolve) => setTimeout(resolve, wait));
    }
  }
}
