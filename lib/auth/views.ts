import type { Role } from '@/models/User';

/** The signed-in person, re-read from the database on each request so a role change or deactivation takes effect at once. */
export interface Actor {
  id: number;
  studioId: number;
  role: Role;
  name: string;
  email: string;
}
