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

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      user?: AuthUser;
      sessionId?: string;
    }
  }
}
