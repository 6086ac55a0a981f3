// The readings table of a venue: every reading, corrections and the ones they superseded.
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import { readingsTableRepository } from '../db/readings-table.repository';
import { accessService } from './access.service';
import { csvCell, safeFileName } from '../lib/spreadsheet';
import { matchesReadingsFilter, type ReadingsFilter } from '../../shared/schemas/readings-table';
import { isoWithOffset } from '../../shared/format/date-time';

const CSV_COLUMNS = [
  ['Strip', 'stripLabel'],
  ['Position', 'positionName'],
  ['Asset tag', 'assetTag'],
  ['Test', 'testKind'],
  ['Conductors', 'conductors'],
  ['Value as typed', 'valueText'],
  // What the meter showed, less the technician's test-lead null, is the value that was judged.
  ['Lead null (ohm)', 'leadOffsetOhm'],
  ['Value (ohm)', 'valueOhm'],
  ['Over range', 'overRange'],
  ['Verdict', 'verdict'],
  ['Limit (ohm)', 'limitOhm'],
  ['Limit kind', 'limitKind'],
  ['Source', 'source'],
  ['Profile', 'profileName'],
  ['Profile version', 'profileVersion'],
  ['Taken by', 'takenByName'],
  // ISO 8601 with the venue's offset: the hall's clock, and still one exact instant.
  ['Taken at', 'takenAt'],
  ['Received at', 'receivedAt'],
  ['Corrects reading', 'supersedesId'],
  ['Correction reason', 'correctionReason'],
  ['Superseded by', 'supersededBy'],
  ['Lead null meter', 'leadNullMeter'],
  ['Lead null id', 'leadNullId'],
  ['Reading id', 'id'],
] as const;

export function readingsTableService(deps: AppDeps) {
  const repo = readingsTableRepository(deps.db);
  const access = accessService(deps.db);

  function rows(user: AuthUser, venueId: string, filter: ReadingsFilter) {
    const { venue } = access.requireVenue(user, venueId, 'read');
    const list = repo.ofVenue(venueId).map((r) => ({ ...r, superseded: r.supersededBy !== null }));
    return { venue, rows: list.filter((r) => matchesReadingsFilter(r, filter)) };
  }

  return {
    list: (user: AuthUser, venueId: string, filter: ReadingsFilter = {}) => rows(user, venueId, filter).rows,
    csv(user: AuthUser, venueId: string, filter: ReadingsFilter = {}) {
      const { venue, rows: list } = rows(user, venueId, filter);
      const lines = [CSV_COLUMNS.map(([h]) => csvCell(h)).join(',')];
      const at = (iso: string | null) => (iso ? isoWithOffset(iso, venue.timeZone) : null);
      for (const r of list) {
        const row = { ...r, takenAt: at(r.takenAt), receivedAt: at(r.receivedAt) };
        lines.push(CSV_COLUMNS.map(([, k]) => csvCell(row[k])).join(','));
      }
      return { fileName: `${safeFileName(venue.name)}-readings.csv`, body: `${lines.join('\r\n')}\r\n` };
    },
  };
}
