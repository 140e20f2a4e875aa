import 'server-only';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { z } from 'zod';
import { ensureDb } from '@/lib/db/connection.server';
import { User } from '@/models';
import { verifyPassword } from './passwords.server';

const credentialsSchema = z.object({
  email: z.string().trim().toLowerCase().email().max(254),
  password: z.string().min(1).max(200),
});

/** Checks an e-mail and password; returns null for every kind of failure alike. */
export async function checkCredentials(input: unknown) {
  const parsed = credentialsSchema.safeParse(input);
  if (!parsed.success) return null;
  ensureDb();
  const user = await User.findOne({ where: { email: parsed.data.email } });
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
      async authorize(credentials) {
        const user = await checkCredentials(credentials);
        if (!user) return null;
        return { id: String(user.id), name: user.name, email: user.email, studioId: user.studioId, role: user.role };
      },
    }),
  ],
  callbacks: {
    async jwt({ token, user }) {
      if (user) {
        token.uid = Number(user.id);
        token.studioId = user.studioId;
        token.role = user.role;
      }
      return token;
    },
    async session({ session, token }) {
      session.user = { id: token.uid, studioId: token.studioId, role: token.role, name: token.name ?? '', email: token.email ?? '' };
      return session;
    },
  },
};
