// Register import: a spreadsheet is read, each row checked against the register, and the good rows
// written in one transaction. The preview and the import run the same plan; the import plans again
// inside its transaction, so what it writes matches the register at that moment.
import type { AppDeps } from '../deps';
import type { AuthUser } from '../auth/types';
import type { Db, Tx } from '../db/client';
import { equipmentRepository, type EquipmentRow } from '../db/equipment.repository';
import { recordAudit } from '../db/audit.repository';
import type { SheetLimits } from '../lib/spreadsheet';
import { registerCsv } from './equipment-csv';
import type { WorkerPool } from '../workers/pool';
import { conflict, unprocessable } from '../lib/app-error';
import { nowIso } from '../lib/ids';
import { insertEquipmentItem } from './equipment.service';
import type { UploadedFile } from '../http/upload';
import {
  createEquipmentSchema,
  updateEquipmentSchema,
  EQUIPMENT_KIND_LABELS,
  EQUIPMENT_STATUS_LABELS,
} from '../../shared/schemas/equipment';
import {
  IMPORT_FIELDS,
  IMPORT_LIMITS,
  type ImportAction,
  type ImportField,
  type ImportMapping,
  type ImportMode,
  type ImportOptions,
  type ImportPreview,
  type ImportReport,
  type ImportRowResult,
} from '../../shared/schemas/equipment-import';
import {
  parseConductor,
  parseDecimal,
  parseKind,
  parseLength,
  parseStatus,
  suggestMapping,
  unguardCell,
  unitFromHeader,
} from '../../shared/domain/register-import';

type Values = {
  assetTag?: string;
  kind?: EquipmentRow['kind'];
  description?: string;
  lengthM?: number;
  conductorMm2?: number;
  awg?: number;
  cableType?: string;
  velocityFactor?: number;
  status?: EquipmentRow['status'];
  notes?: string;
};

/** Schema field → the import field it comes from (for error messages on the right column). */
const FIELD_OF: Record<string, ImportField> = {
  assetTag: 'assetTag',
  kind: 'kind',
  description: 'description',
  lengthM: 'length',
  conductorMm2: 'conductorMm2',
  awg: 'awg',
  cableType: 'cableType',
  velocityFactor: 'velocityFactor',
  status: 'status',
  notes: 'notes',
};

const SHEET_LIMITS: SheetLimits = {
  maxRows: IMPORT_LIMITS.maxRows,
  maxColumns: IMPORT_LIMITS.maxColumns,
  maxUnpackedBytes: IMPORT_LIMITS.maxUnpackedBytes,
};

interface ReadFile {
  fileName: string;
  format: 'csv' | 'xlsx';
  headerRow: number;
  headers: string[];
  data: { row: number; cells: string[] }[];
}

async function readRegisterFile(workers: WorkerPool, file: UploadedFile): Promise<ReadFile> {
  if (file.size === 0) throw unprocessable('empty-file', 'The file is empty (0 bytes).');
  // Read on a worker thread: unpacking and parsing a workbook is seconds of CPU for a large one.
  const sheet = await workers.run('readSheet', { bytes: file.buffer, fileName: file.originalname, limits: SHEET_LIMITS });
  if (sheet.rows.length === 0) throw unprocessable('no-rows', 'The file has no rows: it needs a header row and one row per item.');
  const [headers, ...rest] = sheet.rows;
  const data = rest.map((cells, i) => ({ row: sheet.rowNumbers[i + 1]!, cells: cells.map(unguardCell) }));
  if (data.length === 0) throw unprocessable('no-rows', 'The file has a header row but no items under it.');
  return {
    fileName: file.originalname,
    format: sheet.format,
    headerRow: sheet.rowNumbers[0]!,
    headers: headers!.map((h) => h.trim()),
    data,
  };
}

function readRow(cells: string[], mapping: ImportMapping, headers: string[]) {
  const values: Values = {};
  const errors: ImportRowResult['errors'] = [];
  const cell = (f: ImportField) => {
    const i = mapping[f];
    return i === undefined || i === null ? '' : (cells[i] ?? '').trim();
  };
  const tag = cell('assetTag');
  if (tag) values.assetTag = tag.toUpperCase();
  const kindText = cell('kind');
  if (kindText) {
    const kind = parseKind(kindText);
    if (kind) values.kind = kind;
    else
      errors.push({
        field: 'kind',
        message: `Unknown kind “${kindText}”; use one of: ${Object.values(EQUIPMENT_KIND_LABELS).join(', ')}.`,
      });
  }
  if (cell('description')) values.description = cell('description');
  const lengthText = cell('length');
  if (lengthText) {
    const lengthCol = mapping.length;
    const parsed = parseLength(lengthText, cell('lengthUnit'), unitFromHeader(lengthCol == null ? undefined : headers[lengthCol]));
    if (parsed.ok) values.lengthM = parsed.value;
    else errors.push({ field: 'length', message: parsed.message });
  }
  for (const field of ['conductorMm2', 'awg'] as const) {
    const text = cell(field);
    if (!text) continue;
    const parsed = parseConductor(text, field === 'awg' ? 'awg' : 'mm2');
    if (!parsed.ok) errors.push({ field, message: parsed.message });
    else if ('mm2' in parsed.value) values.conductorMm2 = parsed.value.mm2;
    else values.awg = parsed.value.awg;
  }
  if (cell('cableType')) values.cableType = cell('cableType');
  const vfText = cell('velocityFactor');
  if (vfText) {
    const vf = parseDecimal(vfText.replace(/%$/, ''));
    if (Number.isFinite(vf)) values.velocityFactor = vfText.trim().endsWith('%') || vf > 1.5 ? vf / 100 : vf;
    else errors.push({ field: 'velocityFactor', message: `“${vfText}” is not a velocity factor (e.g. 0.66 or 66 %).` });
  }
  const statusText = cell('status');
  if (statusText) {
    const status = parseStatus(statusText);
    if (status) values.status = status;
    else
      errors.push({
        field: 'status',
        message: `Unknown status “${statusText}”; use one of: ${Object.values(EQUIPMENT_STATUS_LABELS).join(', ')}.`,
      });
  }
  if (cell('notes')) values.notes = cell('notes');
  return { values, errors };
}

/** The schema's complaints, leaving out fields that already have a more precise one from reading the cell. */
const schemaErrors = (issues: { path: PropertyKey[]; message: string }[], already: ImportRowResult['errors']): ImportRowResult['errors'] =>
  issues
    .map((i) => ({ field: FIELD_OF[String(i.path[0])] ?? ('row' as const), message: i.message }))
    .filter((e) => !already.some((a) => a.field === e.field));

/** Which of the row's values differ from the item (empty cells leave the item's value as it is). */
function changesOf(item: EquipmentRow, values: Values) {
  const changes: Record<string, { from: unknown; to: unknown }> = {};
  for (const [k, v] of Object.entries(values)) {
    if (k === 'assetTag' || v === undefined) continue;
    const current = item[k as keyof EquipmentRow];
    if (current !== v) changes[k] = { from: current, to: v };
  }
  return changes;
}

function plan(db: Db | Tx, user: AuthUser, file: ReadFile, mapping: ImportMapping, mode: ImportMode): ImportRowResult[] {
  const repo = equipmentRepository(db);
  const read = file.data.map((d) => ({ ...d, ...readRow(d.cells, mapping, file.headers) }));
  const rowsOfTag = new Map<string, number[]>();
  for (const r of read) {
    if (!r.values.assetTag) continue;
    rowsOfTag.set(r.values.assetTag, [...(rowsOfTag.get(r.values.assetTag) ?? []), r.row]);
  }
  return read.map((r): ImportRowResult => {
    const errors = [...r.errors];
    const tag = r.values.assetTag ?? null;
    const shown = Object.fromEntries(Object.entries(r.values).map(([k, v]) => [k, v ?? null])) as ImportRowResult['values'];
    const result = (action: ImportAction, message: string, extra: Partial<ImportRowResult> = {}): ImportRowResult => ({
      row: r.row,
      assetTag: tag,
      action,
      values: shown,
      errors,
      message,
      ...extra,
    });
    if (!tag) {
      errors.push({
        field: 'assetTag',
        message: mapping.assetTag == null ? 'No column is mapped to the asset tag.' : 'The asset tag is empty.',
      });
      return result('error', 'Not imported: no asset tag.');
    }
    const others = rowsOfTag.get(tag)!.filter((n) => n !== r.row);
    if (others.length > 0) {
      errors.push({ field: 'assetTag', message: `Duplicate in file: ${tag} is also on row ${others.join(', ')}.` });
    }
    const existing = repo.findByTag(user.orgId, tag);
    if (!existing) {
      if (r.values.kind === undefined && !errors.some((e) => e.field === 'kind')) {
        errors.push({ field: 'kind', message: 'A new item needs a kind.' });
      }
      const parsed = createEquipmentSchema.safeParse(r.values);
      if (!parsed.success) errors.push(...schemaErrors(parsed.error.issues, errors));
      if (errors.length) return result('error', 'Not imported: fix the marked cells.');
      return result('create', `New item ${tag}.`);
    }
    if (mode === 'create-only') {
      if (errors.length) return result('error', 'Not imported: fix the marked cells.');
      return result('skip', `${tag} is already in the register; not changed (add-only import).`);
    }
    const changes = changesOf(existing, r.values);
    const parsed = updateEquipmentSchema.safeParse(Object.fromEntries(Object.entries(changes).map(([k, c]) => [k, c.to])));
    if (Object.keys(changes).length > 0 && !parsed.success) errors.push(...schemaErrors(parsed.error.issues, errors));
    if (changes.kind && repo.assignmentsOf(existing.id).some((a) => !a.assignment.removedAt)) {
      errors.push({ field: 'kind', message: `${tag} sits in a position of a venue plan; take it off before changing its kind.` });
    }
    if (errors.length) return result('error', 'Not imported: fix the marked cells.', { changes });
    if (Object.keys(changes).length === 0) return result('unchanged', `${tag} is already in the register with these values.`);
    return result('update', `Would update ${tag}: ${Object.keys(changes).join(', ')}.`, { changes });
  });
}

function summaryOf(rows: ImportRowResult[]): Record<ImportAction, number> {
  const s: Record<ImportAction, number> = { create: 0, update: 0, unchanged: 0, skip: 0, error: 0 };
  for (const r of rows) s[r.action]++;
  return s;
}

/** Writes the import: the good rows go in together or not at all (one transaction). */
function writeImport(db: Db, user: AuthUser, file: ReadFile, mapping: ImportMapping, mode: ImportMode, report: ImportReport) {
  const at = nowIso();
  try {
    db.transaction((tx) => {
      const rows = plan(tx, user, file, mapping, mode);
      const repo = equipmentRepository(tx);
      for (const r of rows) {
        if (r.action === 'create') {
          const v = createEquipmentSchema.parse(r.values);
          const id = insertEquipmentItem(tx, user, v, { createdAt: at, auditDetail: { via: 'import', file: file.fileName, row: r.row } });
          report.created.push({ row: r.row, assetTag: v.assetTag, id });
        } else if (r.action === 'update') {
          const item = repo.findByTag(user.orgId, r.assetTag!)!;
          const patch = Object.fromEntries(Object.entries(r.changes!).map(([k, c]) => [k, c.to]));
          if (!repo.updateIfVersion(item.id, item.version, patch)) throw new Error(`version moved under the import for ${item.assetTag}`);
          recordAudit(tx, user, 'equipment.updated', 'equipment', item.id, {
            assetTag: item.assetTag,
            changed: r.changes,
            via: 'import',
            file: file.fileName,
            row: r.row,
          });
          report.updated.push({ row: r.row, assetTag: item.assetTag, id: item.id, changes: r.changes! });
        } else {
          const reason = r.action === 'error' ? r.errors.map((e) => e.message).join(' ') : r.message;
          report.skipped.push({ row: r.row, assetTag: r.assetTag, reason });
        }
      }
      if (rows.every((r) => r.action === 'error')) {
        throw unprocessable('nothing-to-import', 'No row of the file can be imported; fix the rows marked in the preview.', { report });
      }
      recordAudit(tx, user, 'equipment.imported', 'equipment-register', user.orgId, {
        file: file.fileName,
        mode,
        created: report.created.length,
        updated: report.updated.length,
        skipped: report.skipped.length,
      });
    });
  } catch (err) {
    // A constraint that fails while writing (e.g. the same tag added meanwhile) undoes the whole import.
    const code = (err as { code?: unknown }).code;
    if (typeof code === 'string' && code.startsWith('SQLITE_CONSTRAINT')) {
      throw conflict(
        'import-failed',
        `The import was not written, nothing was changed: ${(err as Error).message}. Preview the file again and retry.`,
      );
    }
    throw err;
  }
}

export function equipmentImportService(deps: AppDeps) {
  return {
    async preview(user: AuthUser, upload: UploadedFile, options: ImportOptions): Promise<ImportPreview> {
      const file = await readRegisterFile(deps.workers, upload);
      const suggestedMapping = suggestMapping(file.headers);
      const mapping = options.mapping ?? suggestedMapping;
      const rows = plan(deps.db, user, file, mapping, options.mode);
      return {
        fileName: file.fileName,
        format: file.format,
        headerRow: file.headerRow,
        columns: file.headers.map((header, index) => ({
          index,
          header,
          samples: file.data.slice(0, 3).map((d) => d.cells[index] ?? ''),
        })),
        mapping,
        suggestedMapping,
        mode: options.mode,
        rows,
        summary: summaryOf(rows),
      };
    },

    async run(user: AuthUser, upload: UploadedFile, options: ImportOptions): Promise<ImportReport> {
      const file = await readRegisterFile(deps.workers, upload);
      const mapping = options.mapping;
      if (!mapping || mapping.assetTag == null) {
        throw unprocessable('mapping-required', 'Send the column mapping, with a column for the asset tag (preview the file first).', {
          errors: [{ path: 'mapping.assetTag', message: 'Map a column to the asset tag' }],
        });
      }
      for (const f of Object.keys(mapping)) {
        if (!(IMPORT_FIELDS as readonly string[]).includes(f)) throw unprocessable('bad-mapping', `Unknown field ${f} in the mapping.`);
      }
      const report: ImportReport = { mode: options.mode, created: [], updated: [], skipped: [] };
      writeImport(deps.db, user, file, mapping, options.mode, report);
      return report;
    },

    /** The register as CSV, in the columns the import reads back. */
    csv(user: AuthUser) {
      return registerCsv(equipmentRepository(deps.db).list(user.orgId, {}));
    },
  };
}
