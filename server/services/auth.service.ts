import { randomBytes } from 'node:crypto';
import type { AppDeps } from '../deps';
import { authRepository, type UserRow } from '../db/auth.repository';
import { recordAudit } from '../db/audit.repository';
import { hashPassword, verifyPassword } from '../auth/password';
import { refuseCommonPassword } from '../auth/common-passwords';
import { signSessionToken, verifySessionToken } from '../auth/session-token';
import type { AuthUser } from '../auth/types';
import { AppError, notFound, unprocessable } from '../lib/app-error';
import { newId, nowIso, sha256Hex } from '../lib/ids';
import type { InviteUserInput, UpdateUserInput } from '../../shared/schemas/auth';
import { publicUser, toAuthUser } from '../presenters/users';
import { bindScope } from './bind';
import { mailRepository } from '../db/mail.repository';
import { composeMail, link, p } from '../mail/compose';

const TOKEN_TTL_HOURS = { invite: 72, reset: 2 } as const;
const TOUCH_EVERY_MS = 60_000;

function scopeOf(deps: AppDeps) {
  const repo = authRepository(deps.db);
  const idleMs = deps.env.SESSION_IDLE_MINUTES * 60_000;
  const absoluteMs = deps.env.SESSION_ABSOLUTE_HOURS * 3_600_000;
  // Compared against when the e-mail is unknown, so both paths cost the same (no account probing).
  const dummyHash = hashPassword('not-a-real-password', deps.scrypt);
  return { deps, repo, idleMs, absoluteMs, dummyHash };
}
type Scope = ReturnType<typeof scopeOf>;

async function issueToken({ repo }: Scope, user: UserRow, purpose: 'invite' | 'reset') {
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

/** An invitation names the admin who sent it; a reset, the organisation's first admin. */
async function sendLink(scope: Scope, user: UserRow, purpose: 'invite' | 'reset', invitedBy?: AuthUser) {
  const { deps } = scope;
  const token = await issueToken(scope, user, purpose);
  const url = `${deps.env.APP_ORIGIN}/set-password/${token}`;
  const hours = TOKEN_TTL_HOURS[purpose];
  const mail = mailRepository(deps.db);
  const orgName = mail.organisationName(user.orgId);
  const admin = invitedBy ?? mail.firstAdmin(user.orgId);
  const blocks =
    purpose === 'invite'
      ? [
          p(`${invitedBy?.name ?? 'An administrator'} has invited you to ${orgName}'s Stripwarden as ${user.role}.`),
          link(`Choose your password (the link works once and expires in ${hours} hours)`, url),
        ]
      : [
          p(`Someone asked to reset your Stripwarden password at ${orgName}. If it was you, choose a new one.`),
          link(`Choose a new password (the link works once and expires in ${hours} hours)`, url),
          p('If it was not you, ignore this message: your password stays as it is.'),
        ];
  const composed = composeMail({
    orgName,
    origin: deps.env.APP_ORIGIN,
    recipientName: user.name,
    subject: purpose === 'invite' ? `Your Stripwarden invitation from ${orgName}` : 'Reset your Stripwarden password',
    blocks,
    contact: admin
      ? { name: admin.name, email: admin.email, role: invitedBy ? 'the administrator who invited you' : 'an administrator' }
      : null,
  });
  await deps.mailer.send({ orgId: user.orgId, to: user.email, ...composed });
}

/** Null on any failure: the caller answers one message whether the e-mail exists or not. */
async function signIn({ deps, repo, absoluteMs, dummyHash }: Scope, email: string, password: string, userAgent?: string) {
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
}

/** Resolves a cookie to its user, or null if the session is unknown, revoked, idle or expired. */
async function resolve({ deps, repo, idleMs }: Scope, token: string): Promise<{ user: AuthUser; sessionId: string } | null> {
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
}

function signOut({ repo }: Scope, sessionId: string) {
  repo.revokeSession(sessionId, nowIso());
}

function listUsers({ repo }: Scope, orgId: string) {
  return repo.listUsers(orgId).map((u) => ({ ...publicUser(u), disabled: u.disabled, invited: !u.passwordHash }));
}

async function invite(scope: Scope, actor: AuthUser, input: InviteUserInput) {
  const { deps, repo } = scope;
  if (repo.findUserByEmail(input.email)) {
    throw new AppError(409, 'email-taken', `${input.email} already has an account.`);
  }
  const id = newId();
  deps.db.transaction((tx) => {
    authRepository(tx).insertUser({ id, orgId: actor.orgId, email: input.email, name: input.name, role: input.role });
    recordAudit(tx, actor, 'user.invited', 'user', id, { role: input.role });
  });
  const user = repo.findUserById(id)!;
  await sendLink(scope, user, 'invite', actor);
  return { ...publicUser(user), disabled: false, invited: true };
}

function updateUser({ deps, repo }: Scope, actor: AuthUser, userId: string, patch: UpdateUserInput) {
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
    recordAudit(tx, actor, 'user.updated', 'user', userId, patch);
  });
  const updated = repo.findUserById(userId)!;
  return { ...publicUser(updated), disabled: updated.disabled, invited: !updated.passwordHash };
}

function endSessions({ deps, repo }: Scope, actor: AuthUser, userId: string) {
  const user = repo.findUserById(userId);
  if (!user || user.orgId !== actor.orgId) throw notFound('That person');
  deps.db.transaction((tx) => {
    authRepository(tx).revokeUserSessions(userId, nowIso());
    recordAudit(tx, actor, 'user.sessions-ended', 'user', userId);
  });
}

/**
 * Called after the answer has gone out (the route answers first), so an existing address and an
 * unknown one answer alike; only an existing, enabled account gets a message.
 */
async function requestReset(scope: Scope, email: string) {
  const { repo } = scope;
  const user = repo.findUserByEmail(email);
  if (user && !user.disabled) await sendLink(scope, user, 'reset');
}

function checkToken({ repo }: Scope, token: string) {
  const row = repo.findTokenByHash(sha256Hex(token));
  if (!row) throw new AppError(404, 'link-unknown', 'This link is not valid. Ask for a new one.');
  if (row.usedAt) throw new AppError(410, 'link-used', 'This link has already been used. Ask for a new one.');
  if (Date.parse(row.expiresAt) <= Date.now()) throw new AppError(410, 'link-expired', 'This link has expired. Ask for a new one.');
  const user = repo.findUserById(row.userId)!;
  if (user.disabled) throw new AppError(410, 'link-unknown', 'This account is disabled.');
  return { row, user };
}

async function setPassword(scope: Scope, token: string, password: string) {
  const { deps } = scope;
  const { row, user } = checkToken(scope, token);
  await refuseCommonPassword(password, user);
  const hash = await hashPassword(password, deps.scrypt);
  deps.db.transaction((tx) => {
    const r = authRepository(tx);
    // Re-checked inside the transaction: two clicks on one link set the password once.
    const used = r.markTokenUsed(row.id, nowIso());
    if (used.changes !== 1) throw new AppError(410, 'link-used', 'This link has already been used. Ask for a new one.');
    r.updateUser(user.id, { passwordHash: hash });
    r.revokeUserSessions(user.id, nowIso());
    recordAudit(tx, user, `user.password-set`, 'user', user.id, { via: row.purpose });
  });
  return publicUser(user);
}

function setPreferences({ repo }: Scope, userId: string, unitSystem: 'metric' | 'imperial') {
  repo.updateUser(userId, { unitSystem });
  return publicUser(repo.findUserById(userId)!);
}

export function authService(deps: AppDeps) {
  return bindScope(scopeOf(deps), {
    signIn,
    resolve,
    signOut,
    listUsers,
    invite,
    updateUser,
    endSessions,
    requestReset,
    checkToken,
    setPassword,
    setPreferences,
  });
}
export type AuthService = ReturnType<typeof authService>;
