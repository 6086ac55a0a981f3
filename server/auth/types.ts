export const ROLES = ['admin', 'organiser', 'director', 'technician'] as const;
export type Role = (typeof ROLES)[number];

export interface AuthUser {
  id: string;
  orgId: string;
  email: string;
  name: string;
  role: Role;
  unitSystem: 'metric' | 'imperial';
}

/** What authenticate() needs: a session cookie's token to its live session (the auth service does it). */
export interface SessionResolver {
  resolve(token: string): Promise<{ user: AuthUser; sessionId: string } | null>;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      user?: AuthUser;
      sessionId?: string;
    }
  }
}
