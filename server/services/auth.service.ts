import { randomBytes } from 'node:crypto';
import type { AppDeps } from '../deps';
import { authRepository, type UserRow } from '../db/auth.repository';
import { writeAudit } from '../db/audit.repository';
import { hashPassword, verifyPassword } from '../auth/password';
import { refuseCommonPassword } from '../auth/common-passwords';
import { signSessionToken, verifySessionToken } from '../auth/session-token';
import type { AuthUser } from '../auth/types';
import { AppError, notFound, unprocessable } from '../lib/app-error';
import { newId, nowIso, sha256Hex } from '../lib/ids';
import type { InviteUserInput, UpdateUserInput } from '../../shared/schemas/auth';

const TOKEN_TTL_HOURS = { invite: 72, reset: 2 } as const;
const TOUCH_EVERY_MS = 60_000;

export function toAuthUser(u: Pick<UserRow, 'id' | 'orgId' | 'email' | 'name' | 'role' | 'unitSystem'>): AuthUser {
  return { id: u.id, orgId: u.orgId, email: u.email, name: u.name, role: u.role, unitSystem: u.unitSystem };
}

export function publicUser(u: AuthUser | UserRow) {
  return { id: u.id, email: u.email, name: u.name, role: u.role, unitSystem: u.unitSystem };
}

export function authService(deps: AppDeps) {
  const repo = authRepository(deps.db);
  const idleMs = deps.env.SESSION_IDLE_MINUTES * 60_000;
  const absoluteMs = deps.env.SESSION_ABSOLUTE_HOURS * 3_600_000;
  // Compared against when the e-mail is unknown, so both paths cost the same (no account probing).
  const dummyHash = hashPassword('not-a-real-password', deps.scrypt);

  async function issueToken(user: UserRow, purpose: 'invite' | 'reset') {
    const token = randomBytes(32).toString('base64url');
    const at = nowIso();
    repo.revokeOpenTokens(user.id, at);
    repo.insertToken({
      id: newId(),
      userId: user.id,
      purpose,
      tokenHash: sha256Hex(token),
      expiresAt: new Date(Date.now() + TOKEN_TTL_HOURS[purpose] * 3_600_000).toISOString(),
    });
    return token;
  }

  async function sendLink(user: UserRow, purpose: 'invite' | 'reset', invitedBy?: string) {
    const token = await issueToken(user, purpose);
    const link = `${deps.env.APP_ORIGIN}/set-password/${token}`;
    const hours = TOKEN_TTL_HOURS[purpose];
    const text =
      purpose === 'invite'
        ? `Hello ${user.name},\n\n${invitedBy ?? 'An administrator'} has invited you to Stripwarden as ${user.role}.\n\nChoose your password here (the link works once and expires in ${hours} hours):\n${link}\n`
        : `Hello ${user.name},\n\nSomeone asked to reset your Stripwarden password. If it was you, choose a new one here (the link works once and expires in ${hours} hours):\n${link}\n\nIf it was not you, ignore this message.\n`;
    await deps.mailer.send({
      orgId: user.orgId,
      to: user.email,
      subject: purpose === 'invite' ? 'Your Stripwarden invitation' : 'Reset your Stripwarden password',
      text,
    });
  }

  return {
    /** Null on any failure: the caller answers one message whether the e-mail exists or not. */
    async signIn(email: string, password: string, userAgent?: string) {
      const user = repo.findUserByEmail(email);
      if (!user || !user.passwordHash || user.disabled) {
        await verifyPassword(password, await dummyHash);
        return null;
      }
      if (!(await verifyPassword(password, user.passwordHash))) return null;
      // A new session at every sign-in (OWASP ASVS 7.2.4).
      const sessionId = newId();
      const now = new Date();
      const expiresAt = new Date(now.getTime() + absoluteMs);
      repo.insertSession({
        id: sessionId,
        userId: user.id,
        lastSeenAt: now.toISOString(),
        expiresAt: expiresAt.toISOString(),
        userAgent: userAgent?.slice(0, 200),
      });
      const token = await signSessionToken(deps.sessionSecret, sessionId, user.id, expiresAt);
      return { user: toAuthUser(user), token, expiresAt };
    },

    /** Resolves a cookie to its user, or null if the session is unknown, revoked, idle or expired. */
    async resolve(token: string): Promise<{ user: AuthUser; sessionId: string } | null> {
      const claims = await verifySessionToken(deps.sessionSecret, token);
      if (!claims) return null;
      const found = repo.findSessionWithUser(claims.sessionId);
      if (!found) return null;
      const { session, user } = found;
      if (session.revokedAt || session.userId !== claims.userId) return null;
      const now = Date.now();
      if (Date.parse(session.expiresAt) <= now) return null;
      if (Date.parse(session.lastSeenAt) + idleMs <= now) return null;
      if (user.disabled) return null;
      if (now - Date.parse(session.lastSeenAt) > TOUCH_EVERY_MS) repo.touchSession(session.id, new Date(now).toISOString());
      return { user: toAuthUser(user), sessionId: session.id };
    },

    signOut(sessionId: string) {
      repo.revokeSession(sessionId, nowIso());
    },

    listUsers(orgId: string) {
      return repo.listUsers(orgId).map((u) => ({ ...publicUser(u), disabled: u.disabled, invited: !u.passwordHash }));
    },

    async invite(actor: AuthUser, input: InviteUserInput) {
      if (repo.findUserByEmail(input.email)) {
        throw new AppError(409, 'email-taken', `${input.email} already has an account.`);
      }
      const id = newId();
      deps.db.transaction((tx) => {
        authRepository(tx).insertUser({ id, orgId: actor.orgId, email: input.email, name: input.name, role: input.role });
        writeAudit(tx, { orgId: actor.orgId, actorId: actor.id, action: 'user.invited', entityType: 'user', entityId: id, detail: { role: input.role } });
      });
      const user = repo.findUserById(id)!;
      await sendLink(user, 'invite', actor.name);
      return { ...publicUser(user), disabled: false, invited: true };
    },

    updateUser(actor: AuthUser, userId: string, patch: UpdateUserInput) {
      const user = repo.findUserById(userId);
      if (!user || user.orgId !== actor.orgId) throw notFound('That person');
      if (userId === actor.id && (patch.disabled || (patch.role && patch.role !== 'admin'))) {
        throw unprocessable('own-account', 'You cannot disable yourself or remove your own admin role.');
      }
      deps.db.transaction((tx) => {
        const r = authRepository(tx);
        r.updateUser(userId, patch);
        // Disabling a user or changing their role ends their sessions (OWASP ASVS 7.4.2).
        if (patch.disabled || (patch.role && patch.role !== user.role)) r.revokeUserSessions(userId, nowIso());
        writeAudit(tx, { orgId: actor.orgId, actorId: actor.id, action: 'user.updated', entityType: 'user', entityId: userId, detail: patch });
      });
      const updated = repo.findUserById(userId)!;
      return { ...publicUser(updated), disabled: updated.disabled, invited: !updated.passwordHash };
    },

    endSessions(actor: AuthUser, userId: string) {
      const user = repo.findUserById(userId);
      if (!user || user.orgId !== actor.orgId) throw notFound('That person');
      deps.db.transaction((tx) => {
        authRepository(tx).revokeUserSessions(userId, nowIso());
        writeAudit(tx, { orgId: actor.orgId, actorId: actor.id, action: 'user.sessions-ended', entityType: 'user', entityId: userId });
      });
    },

    /**
     * Called after the answer has gone out (the route answers first), so an existing address and an
     * unknown one answer alike; only an existing, enabled account gets a message.
     */
    async requestReset(email: string) {
      const user = repo.findUserByEmail(email);
      if (user && !user.disabled) await sendLink(user, 'reset');
    },

    checkToken(token: string) {
      const row = repo.findTokenByHash(sha256Hex(token));
      if (!row) throw new AppError(404, 'link-unknown', 'This link is not valid. Ask for a new one.');
      if (row.usedAt) throw new AppError(410, 'link-used', 'This link has already been used. Ask for a new one.');
      if (Date.parse(row.expiresAt) <= Date.now()) throw new AppError(410, 'link-expired', 'This link has expired. Ask for a new one.');
      const user = repo.findUserById(row.userId)!;
      if (user.disabled) throw new AppError(410, 'link-unknown', 'This account is disabled.');
      return { row, user };
    },

    async setPassword(token: string, password: string) {
      const { row, user } = this.checkToken(token);
      await refuseCommonPassword(password, user);
      const hash = await hashPassword(password, deps.scrypt);
      deps.db.transaction((tx) => {
        const r = authRepository(tx);
        // Re-checked inside the transaction: two clicks on one link set the password once.
        const used = r.markTokenUsed(row.id, nowIso());
        if (used.changes !== 1) throw new AppError(410, 'link-used', 'This link has already been used. Ask for a new one.');
        r.updateUser(user.id, { passwordHash: hash });
        r.revokeUserSessions(user.id, nowIso());
        writeAudit(tx, { orgId: user.orgId, actorId: user.id, action: `user.password-set`, entityType: 'user', entityId: user.id, detail: { via: row.purpose } });
      });
      return publicUser(user);
    },

    setPreferences(userId: string, unitSystem: 'metric' | 'imperial') {
      repo.updateUser(userId, { unitSystem });
      return publicUser(repo.findUserById(userId)!);
    },
  };
}
export type AuthService = ReturnType<typeof authService>;
