// Limit profiles: copied and edited by admins and directors. An edit adds a version to the
// lineage and never rewrites one, so every reading keeps the version it was checked with.
import type { AppDeps } from '../deps';
import type { Db } from '../db/client';
import type { AuthUser } from '../auth/types';
import { profilesRepository, type ProfileRow } from '../db/profiles.repository';
import { recordAudit } from '../db/audit.repository';
import { notFound } from '../lib/app-error';
import { newId, nowIso } from '../lib/ids';
import { requireVersion } from '../http/etag';
import type { LimitProfile } from '../../shared/domain/limits';
import type { UpdateProfileInput } from '../../shared/schemas/limit-profile';
import { presentProfile, toLimitProfile } from '../presenters/profiles';
import { bindScope } from './bind';

// Limit profile rows are never rewritten (an edit adds a row with the next version, below), so a
// profile parsed once by id stays right: every reading is judged against one, and parsing its
// rules each time was a large share of a write. One map per database.
const parsedById = new WeakMap<object, Map<string, LimitProfile>>();

/** The profile with this row id, parsed once; undefined when there is no such row. */
export function limitProfileById(db: Db, id: string): LimitProfile | undefined {
  let known = parsedById.get(db);
  if (!known) parsedById.set(db, (known = new Map()));
  let profile = known.get(id);
  if (!profile) {
    const row = profilesRepository(db).findById(id);
    if (!row) return undefined;
    profile = toLimitProfile(row);
    if (known.size >= 500) known.clear();
    known.set(id, profile);
  }
  return profile;
}

type Scope = { deps: AppDeps; repo: ReturnType<typeof profilesRepository> };

function requireProfile({ repo }: Scope, user: AuthUser, id: string) {
  const row = repo.findById(id);
  if (!row || row.orgId !== user.orgId) throw notFound('That limit profile');
  return row;
}

/** The latest version of every lineage, each with its older versions listed. */
function list({ repo }: Scope, user: AuthUser) {
  const rows = repo.ofOrg(user.orgId);
  const byLineage = new Map<string, ProfileRow[]>();
  for (const r of rows) byLineage.set(r.lineageId, [...(byLineage.get(r.lineageId) ?? []), r]);
  return [...byLineage.values()]
    .map((versions) => {
      const sorted = [...versions].sort((a, b) => b.version - a.version);
      const latest = sorted[0];
      const p = presentProfile(latest);
      return {
        ...p,
        ruleCount: p.rules.length,
        houseRuleCount: p.rules.filter((r) => r.houseRule).length,
        versions: sorted.map((v) => ({ id: v.id, version: v.version, createdAt: v.createdAt })),
      };
    })
    .sort((a, b) => a.name.localeCompare(b.name));
}

function get(scope: Scope, user: AuthUser, id: string) {
  const { repo } = scope;
  const row = requireProfile(scope, user, id);
  const versions = repo.versionsOf(row.lineageId);
  return {
    ...presentProfile(row),
    latestVersion: versions[0]?.profile.version ?? row.version,
    latestId: versions[0]?.profile.id ?? row.id,
    versions: versions.map((v) => ({
      id: v.profile.id,
      version: v.profile.version,
      createdAt: v.profile.createdAt,
      byName: v.byName,
      notes: v.profile.notes,
    })),
    usedBy: repo.venuesUsing(user.orgId, row.lineageId),
  };
}

function copy(scope: Scope, user: AuthUser, id: string, name: string) {
  const source = requireProfile(scope, user, id);
  const newRowId = newId();
  scope.deps.db.transaction((tx) => {
    profilesRepository(tx).insert({
      id: newRowId,
      orgId: user.orgId,
      lineageId: newId(),
      name,
      version: 1,
      rulesJson: source.rulesJson,
      loopRequiredJson: source.loopRequiredJson,
      temperatureReferenceC: source.temperatureReferenceC,
      notes: `Copied from “${source.name}” version ${source.version}.`,
      createdBy: user.id,
      createdAt: nowIso(),
    });
    recordAudit(tx, user, 'profile.copied', 'limit-profile', newRowId, {
      name,
      fromProfileId: source.id,
      fromName: source.name,
      fromVersion: source.version,
    });
  });
  return get(scope, user, newRowId);
}

/** Stores the edit as version n+1; If-Match must name the lineage's latest version. */
function update(scope: Scope, user: AuthUser, id: string, ifMatch: string | undefined, input: UpdateProfileInput) {
  const newRowId = newId();
  scope.deps.db.transaction((tx) => {
    const r = profilesRepository(tx);
    const row = r.findById(id);
    if (!row || row.orgId !== user.orgId) throw notFound('That limit profile');
    const latest = r.latestOf(row.lineageId)!;
    requireVersion(
      ifMatch,
      latest.version,
      (yours, current) =>
        `Someone else changed “${latest.name}” meanwhile: you edited version ${yours ?? '?'}, the latest is version ${current}. Open version ${current}, then apply your changes again.`,
    );
    r.insert({
      id: newRowId,
      orgId: user.orgId,
      lineageId: row.lineageId,
      name: input.name ?? latest.name,
      version: latest.version + 1,
      rulesJson: JSON.stringify(input.rules),
      loopRequiredJson: input.loopRequired ? JSON.stringify(input.loopRequired) : latest.loopRequiredJson,
      temperatureReferenceC: input.temperatureReferenceC === undefined ? latest.temperatureReferenceC : input.temperatureReferenceC,
      notes: input.notes === undefined ? latest.notes : input.notes,
      createdBy: user.id,
      createdAt: nowIso(),
    });
    recordAudit(tx, user, 'profile.versioned', 'limit-profile', newRowId, {
      lineageId: row.lineageId,
      name: input.name ?? latest.name,
      fromVersion: latest.version,
      version: latest.version + 1,
    });
  });
  return get(scope, user, newRowId);
}

export function profilesService(deps: AppDeps) {
  return bindScope({ deps, repo: profilesRepository(deps.db) }, { list, get, copy, update });
}
