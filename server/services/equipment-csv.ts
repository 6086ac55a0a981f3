// The equipment register as CSV, with the same column names the import maps from, so an export
// edited in a spreadsheet can be imported back.
import type { EquipmentRow } from '../db/equipment.repository';
import { csvCell } from '../lib/spreadsheet';

const EXPORT_COLUMNS: [string, (e: EquipmentRow) => unknown][] = [
  ['Asset tag', (e) => e.assetTag],
  ['Kind', (e) => e.kind],
  ['Description', (e) => e.description],
  ['Length (m)', (e) => e.lengthM],
  ['Conductor (mm²)', (e) => e.conductorMm2],
  ['AWG', (e) => e.awg],
  ['Cable type', (e) => e.cableType],
  ['Velocity factor', (e) => e.velocityFactor],
  ['Status', (e) => e.status],
  ['Notes', (e) => e.notes],
];

/** Cells a spreadsheet would run as a formula are guarded (see csvCell). */
export function registerCsv(items: EquipmentRow[]) {
  const lines = [EXPORT_COLUMNS.map(([h]) => csvCell(h)).join(',')];
  for (const e of items) lines.push(EXPORT_COLUMNS.map(([, get]) => csvCell(get(e))).join(','));
  // The BOM lets spreadsheet programs read the file as UTF-8 (mm², names with accents).
  return { fileName: 'equipment-register.csv', body: `\ufeff${lines.join('\r\n')}\r\n` };
}
