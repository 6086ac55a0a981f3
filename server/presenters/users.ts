// A user row as the signed-in person (req.user) and as the API shows a person.
import type { UserRow } from '../db/auth.repository';
import type { AuthUser } from '../auth/types';

export function toAuthUser(u: Pick<UserRow, 'id' | 'orgId' | 'email' | 'name' | 'role' | 'unitSystem'>): AuthUser {
  return { id: u.id, orgId: u.orgId, email: u.email, name: u.name, role: u.role, unitSystem: u.unitSystem };
}

export function publicUser(u: AuthUser | UserRow) {
  return { id: u.id, email: u.email, name: u.name, role: u.role, unitSystem: u.unitSystem };
}
