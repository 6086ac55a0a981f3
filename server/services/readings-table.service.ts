// The readings table of a venue: every reading, corrections and the ones they superseded.
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { readingsTableRepository } from '../db/readings-table.repository';
import { accessService } from './access.service';
import { csvCell, safeFileName } from '../lib/spreadsheet';

const CSV_COLUMNS = [
  ['Strip', 'stripLabel'],
  ['Position', 'positionName'],
  ['Asset tag', 'assetTag'],
  ['Test', 'testKind'],
  ['Conductors', 'conductors'],
  ['Value as typed', 'valueText'],
  ['Value (ohm)', 'valueOhm'],
  ['Over range', 'overRange'],
  ['Verdict', 'verdict'],
  ['Limit (ohm)', 'limitOhm'],
  ['Limit kind', 'limitKind'],
  ['Source', 'source'],
  ['Profile', 'profileName'],
  ['Profile version', 'profileVersion'],
  ['Taken by', 'takenByName'],
  ['Taken at (UTC)', 'takenAt'],
  ['Received at (UTC)', 'receivedAt'],
  ['Corrects reading', 'supersedesId'],
  ['Correction reason', 'correctionReason'],
  ['Superseded by', 'supersededBy'],
  ['Reading id', 'id'],
] as const;

export function readingsTableService(deps: AppDeps) {
  const repo = readingsTableRepository(deps.db);
  const access = accessService(deps.db);

  function rows(user: AuthUser, venueId: string) {
    const { venue } = access.requireVenue(user, venueId, 'read');
    return { venue, rows: repo.ofVenue(venueId).map((r) => ({ ...r, superseded: r.supersededBy !== null })) };
  }

  return {
    list: (user: AuthUser, venueId: string) => rows(user, venueId).rows,
    csv(user: AuthUser, venueId: string) {
      const { venue, rows: list } = rows(user, venueId);
      const lines = [CSV_COLUMNS.map(([h]) => csvCell(h)).join(',')];
      for (const r of list) lines.push(CSV_COLUMNS.map(([, k]) => csvCell(r[k])).join(','));
      return { fileName: `${safeFileName(venue.name)}-readings.csv`, body: `${lines.join('\r\n')}\r\n` };
    },
  };
}
