import type { Role } from '@/models/User';

declare module 'next-auth' {
  interface Session {
    user: { id: number; studioId: number; role: Role; name: string; email: string };
  }
  interface User {
    id: string;
    studioId: number;
    role: Role;
  }
}

declare module 'next-auth/jwt' {
  interface JWT {
    uid: number;
    studioId: number;
    role: Role;
  }
}
