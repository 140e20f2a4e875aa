import NextAuth from 'next-auth';
import { authOptions } from '@/lib/auth/options.server';
import { assertMayTrySignIn, clientAddress, recordSignIn } from '@/lib/auth/signInGuard.server';
import { errorResponse } from '@/lib/http/route.server';

const handler = NextAuth(authOptions);

type Context = { params: Promise<{ nextauth: string[] }> };

/** Password sign-ins pass the failed-attempt limits first; every other auth call goes straight through. */
async function post(request: Request, context: Context) {
  const { nextauth } = await context.params;
  if (nextauth.join('/') !== 'callback/credentials') return handler(request, context);
  const form = new URLSearchParams(await request.clone().text());
  const email = (form.get('email') ?? '').trim().toLowerCase();
  const address = clientAddress(request);
  try {
    assertMayTrySignIn(email, address);
  } catch (error) {
    return errorResponse(error);
  }
  const response: Response = await handler(request, context);
  const failed = response.status === 401 || /[?&]error=/.test(response.headers.get('location') ?? '');
  recordSignIn(email, address, !failed);
  return response;
}

export { handler as GET, post as POST };
