import 'server-only';
import { notFound, redirect } from 'next/navigation';
import { AppError } from '@/lib/errors';

/**
 * Runs a page's data loading and turns service errors into page navigation:
 * signed out → sign-in page, missing or another studio's → the 404 page.
 * Other errors (forbidden included) reach the segment's error boundary.
 */
export async function loadPage<T>(load: () => Promise<T>): Promise<T> {
  try {
    return await load();
  } catch (error) {
    if (error instanceof AppError && error.kind === 'unauthorized') redirect('/signin');
    if (error instanceof AppError && error.kind === 'not_found') notFound();
    throw error;
  }
}
