import NextAuth from 'next-auth';
import { authOptions } from '@/lib/auth/options.server';
import { accountOf, assertMayTrySignIn, clientAddress } from '@/lib/auth/signInGuard.server';
import { AppError } from '@/lib/errors';
import { route } from '@/lib/http/route.server';

const handler = NextAuth(authOptions);

type Context = { params: Promise<{ nextauth: string[] }> };

const isCredentialsCallback = async (context: Context) => (await context.params).nextauth.join('/') === 'callback/credentials';

/** The password sign-in is a form POST only; next-auth would answer a GET of it with a server error. */
async function get(request: Request, context: Context) {
  if (await isCredentialsCallback(context)) throw new AppError('not_allowed:method', 'Sign in with the form on the sign-in page.', { extra: { allow: 'POST' } });
  return handler(request, context);
}

/** Password sign-ins pass the failed-attempt limits first; next-auth counts each password it really checks. */
async function post(request: Request, context: Context) {
  if (await isCredentialsCallback(context)) {
    const form = new URLSearchParams(await request.clone().text());
    await assertMayTrySignIn(accountOf(form.get('email')), clientAddress(request.headers));
  }
  return handler(request, context);
}

export const GET = route(get);
export const POST = route(post, { body: 'form' });
