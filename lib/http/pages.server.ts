import 'server-only';
import { forbidden, notFound, redirect } from 'next/navigation';
import { AppError } from '@/lib/errors';

/**
 * Runs a page's data loading and turns service errors into page navigation:
 * signed out → sign-in page, missing or another studio's → the 404 page, not allowed for this
 * role → the 403 page. Other errors reach the segment's error boundary.
 */
export async function loadPage<T>(load: () => Promise<T>): Promise<T> {
  try {
    return await load();
  } catch (error) {
    if (error instanceof AppError && error.kind === 'unauthorized') redirect('/signin');
    if (error instanceof AppError && error.kind === 'not_found') notFound();
    if (error instanceof AppError && error.kind === 'forbidden') forbidden();
    throw error;
  }
}
