import type { Role } from '@/models/User';

declare module 'next-auth' {
  interface Session {
    user: { id: number; studioId: number; role: Role; name: string; email: string; sessionVersion: number };
  }
  interface User {
    id: string;
    studioId: number;
    role: Role;
    sessionVersion: number;
  }
}

declare module 'next-auth/jwt' {
  interface JWT {
    uid: number;
    studioId: number;
    role: Role;
    /** The person's session version when the cookie was issued; an older one is refused. */
    sessionVersion?: number;
  }
}
