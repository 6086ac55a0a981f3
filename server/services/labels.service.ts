// Label sheets for a venue's strips and items or for the register, and where a scanned tag leads.
// The sheet is drawn on a worker thread, like the certificates: a 120-strip venue is some 700 labels.
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { accessService } from './access.service';
import { labelsRepository } from '../db/labels.repository';
import { equipmentRepository } from '../db/equipment.repository';
import { notFound, unprocessable } from '../lib/app-error';
import { nowIso } from '../lib/ids';
import type { Label, LabelSheetDocument } from '../pdf/label-sheet';
import { itemLabelUrl, stripLabelUrl } from '../../shared/domain/label-codes';
import { EQUIPMENT_KIND_LABELS } from '../../shared/schemas/equipment';
import type { z } from 'zod';
import type { equipmentQuerySchema } from '../../shared/schemas/equipment';

type EquipmentQuery = z.output<typeof equipmentQuerySchema>;
import type { TagLookup } from '../../shared/contracts/labels';
import { bindScope } from './bind';

function scopeOf(deps: AppDeps) {
  return { deps, access: accessService(deps.db), repo: labelsRepository(deps.db), register: equipmentRepository(deps.db) };
}
type Scope = ReturnType<typeof scopeOf>;

interface ItemFacts {
  assetTag: string;
  kind: keyof typeof EQUIPMENT_KIND_LABELS;
  description: string;
}

// An item's label names no strip: items move between strips, the label stays on the item.
const itemLabel = (origin: string, i: ItemFacts): Label => ({
  title: i.assetTag,
  lines: [EQUIPMENT_KIND_LABELS[i.kind], i.description].filter((l) => l !== ''),
  caption: 'Scan to open this item',
  url: itemLabelUrl(origin, i.assetTag),
});

async function render({ deps }: Scope, doc: LabelSheetDocument) {
  if (doc.labels.length === 0) throw unprocessable('nothing-to-label', `${doc.subject} has nothing to print a label for yet.`);
  const pdf = await deps.workers.run('renderLabelSheet', doc);
  return Buffer.from(pdf.buffer, pdf.byteOffset, pdf.byteLength);
}

/** Every strip of the venue in plan order, each followed by the tagged items on it (an item once). */
async function venueSheet(scope: Scope, user: AuthUser, venueId: string) {
  const { venue, event } = scope.access.requireVenue(user, venueId, 'read');
  const origin = scope.deps.env.APP_ORIGIN;
  const labels: Label[] = [];
  const seenStrips = new Set<string>();
  const seenItems = new Set<string>();
  for (const row of scope.repo.stripsWithItems(venueId)) {
    if (!seenStrips.has(row.stripId)) {
      seenStrips.add(row.stripId);
      labels.push({
        title: row.stripLabel,
        lines: [venue.name, row.zone ?? ''].filter((l) => l !== ''),
        caption: 'Scan to test this strip',
        url: stripLabelUrl(origin, row.stripId),
      });
    }
    if (row.equipmentId && row.assetTag && row.kind && !seenItems.has(row.equipmentId)) {
      seenItems.add(row.equipmentId);
      labels.push(itemLabel(origin, { assetTag: row.assetTag, kind: row.kind, description: row.description ?? '' }));
    }
  }
  const pdf = await render(scope, {
    title: `Labels · ${venue.name}`,
    subject: `The venue ${venue.name} (${event.name})`,
    createdAt: nowIso(),
    labels,
  });
  return { pdf, venueName: venue.name };
}

/** The register's items, filtered as its list is; retired items only when asked for by status. */
async function registerSheet(scope: Scope, user: AuthUser, filter: EquipmentQuery) {
  const items = scope.register.list(user.orgId, filter).filter((i) => filter.status !== undefined || i.status !== 'retired');
  const origin = scope.deps.env.APP_ORIGIN;
  return render(scope, {
    title: 'Labels · equipment register',
    subject: 'The register with these filters',
    createdAt: nowIso(),
    labels: items.map((i) => itemLabel(origin, i)),
  });
}

/** A tag of the asker's organisation and the strips it sits on in venues they may see, newest event first. */
function lookupTag(scope: Scope, user: AuthUser, tag: string): TagLookup {
  const item = scope.register.findByTag(user.orgId, tag);
  if (!item) throw notFound(`The asset tag ${tag}`);
  const placements = scope.repo
    .placementsOf(item.id)
    .filter((p) => p.event.orgId === user.orgId && scope.access.canSee(user, p.venue.id))
    .sort((a, b) => b.event.startsOn.localeCompare(a.event.startsOn) || a.stripLabel.localeCompare(b.stripLabel))
    .map((p) => ({
      stripId: p.stripId,
      stripLabel: p.stripLabel,
      position: p.position,
      venueId: p.venue.id,
      venueName: p.venue.name,
      eventName: p.event.name,
    }));
  return { equipmentId: item.id, assetTag: item.assetTag, kind: item.kind, placements };
}

export function labelsService(deps: AppDeps) {
  return bindScope(scopeOf(deps), { venueSheet, registerSheet, lookupTag });
}
