import 'server-only';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { z } from 'zod';
import { ensureDb } from '@/lib/db/connection.server';
import { User } from '@/models';
import { verifyPassword } from './passwords.server';
import { accountOf, clientAddress, recordSignIn } from './signInGuard.server';

const credentialsSchema = z.object({
  email: z.string().trim().toLowerCase().email().max(254),
  password: z.string().min(1).max(200),
});

/** Checks an e-mail and password; returns null for every kind of failure alike. */
export async function checkCredentials(input: unknown) {
  const parsed = credentialsSchema.safeParse(input);
  if (!parsed.success) return null;
  ensureDb();
  const user = await User.findOne({ where: { email: parsed.data.email, active: true } });
  const ok = await verifyPassword(parsed.data.password, user?.passwordHash ?? null);
  if (!user || !ok || !user.active) return null;
  return user;
}

export const authOptions: NextAuthOptions = {
  session: { strategy: 'jwt', maxAge: 12 * 60 * 60 },
  pages: { signIn: '/signin' },
  providers: [
    CredentialsProvider({
      name: 'Takeproof account',
      credentials: { email: { label: 'E-mail', type: 'email' }, password: { label: 'Password', type: 'password' } },
      // Runs only once next-auth has checked the CSRF token, so only a password really checked is counted.
      async authorize(credentials, request) {
        const user = await checkCredentials(credentials);
        await recordSignIn(accountOf(credentials?.email), clientAddress(request.headers ?? {}), user !== null);
        if (!user) return null;
        return { id: String(user.id), name: user.name, email: user.email, studioId: user.studioId, role: user.role, sessionVersion: user.sessionVersion };
      },
    }),
  ],
  callbacks: {
    async jwt({ token, user }) {
      if (user) {
        token.uid = Number(user.id);
        token.studioId = user.studioId;
        token.role = user.role;
        token.sessionVersion = user.sessionVersion;
      }
      return token;
    },
    async session({ session, token }) {
      session.user = { id: token.uid, studioId: token.studioId, role: token.role, name: token.name ?? '', email: token.email ?? '', sessionVersion: token.sessionVersion ?? 0 };
      return session;
    },
  },
  events: {
    // Signing out ends every earlier session of the person, not only this browser's cookie.
    async signOut({ token }) {
      if (!token?.uid) return;
      ensureDb();
      await User.increment('sessionVersion', { where: { id: token.uid } });
    },
  },
  // One line per problem (a forged or stale cookie is routine), never a stack trace.
  logger: {
    error(code, metadata) {
      const message = (metadata instanceof Error ? metadata : metadata?.error)?.message ?? '';
      console.error(`Sign-in: ${code}${message ? `: ${message.split('\n')[0]}` : ''}`);
    },
    warn(code) {
      console.warn(`Sign-in: ${code}`);
    },
    debug() {},
  },
};
