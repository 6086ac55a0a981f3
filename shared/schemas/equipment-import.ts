// Register import from a spreadsheet: the fields a column can map to, the options sent beside the
// file, and the answers (preview and report). Limits keep a hostile file from holding the server.
import { z } from 'zod';

export const IMPORT_LIMITS = {
  maxBytes: 5 * 1024 * 1024,
  /** A workbook is a zip: what it unpacks to, all its parts together (a register of 10 000 rows is a few MB). */
  maxUnpackedBytes: 50 * 1024 * 1024,
  maxRows: 10_000,
  maxColumns: 64,
} as const;

export const IMPORT_FIELDS = [
  'assetTag',
  'kind',
  'description',
  'length',
  'lengthUnit',
  'conductorMm2',
  'awg',
  'cableType',
  'velocityFactor',
  'status',
  'notes',
] as const;
export type ImportField = (typeof IMPORT_FIELDS)[number];

export const IMPORT_FIELD_LABELS: Record<ImportField, string> = {
  assetTag: 'Asset tag',
  kind: 'Kind',
  description: 'Description',
  length: 'Length',
  lengthUnit: 'Length unit (m / ft)',
  conductorMm2: 'Conductor size (mm²)',
  awg: 'Conductor size (AWG)',
  cableType: 'Cable type',
  velocityFactor: 'Velocity factor',
  status: 'Status',
  notes: 'Notes',
};

/** Field → column index (0-based) or null for "not imported". */
export const importMappingSchema = z.partialRecord(
  z.enum(IMPORT_FIELDS),
  z
    .number()
    .int()
    .min(0)
    .max(IMPORT_LIMITS.maxColumns - 1)
    .nullable(),
);
export type ImportMapping = z.infer<typeof importMappingSchema>;

export const IMPORT_MODES = ['create-only', 'create-and-update'] as const;
export type ImportMode = (typeof IMPORT_MODES)[number];
export const IMPORT_MODE_LABELS: Record<ImportMode, string> = {
  'create-only': 'Add new items only',
  'create-and-update': 'Add new items and update existing ones',
};

/** The text fields sent beside the file (multipart): the mapping as JSON, and the mode. */
export const importOptionsSchema = z.object({
  mapping: z
    .string()
    .max(4000)
    .optional()
    .transform((s, ctx) => {
      if (s === undefined || s.trim() === '') return undefined;
      try {
        return JSON.parse(s) as unknown;
      } catch {
        ctx.addIssue({ code: 'custom', message: 'mapping must be JSON, e.g. {"assetTag":0,"kind":1}' });
        return z.NEVER;
      }
    })
    .pipe(importMappingSchema.optional()),
  mode: z.enum(IMPORT_MODES, { error: `mode must be one of: ${IMPORT_MODES.join(', ')}` }).default('create-and-update'),
});
export type ImportOptions = z.output<typeof importOptionsSchema>;

export const IMPORT_ACTIONS = ['create', 'update', 'unchanged', 'skip', 'error'] as const;
export type ImportAction = (typeof IMPORT_ACTIONS)[number];

const change = z.strictObject({ from: z.unknown(), to: z.unknown() });

export const importRowResultSchema = z.strictObject({
  /** Line of the spreadsheet (1 = the header row's line when the header is on the first line). */
  row: z.number().int(),
  assetTag: z.string().nullable(),
  action: z.enum(IMPORT_ACTIONS),
  /** The cells as read with the mapping (normalised: upper-case tag, metres, a known kind). */
  values: z.record(z.string(), z.union([z.string(), z.number(), z.null()])),
  changes: z.record(z.string(), change).optional(),
  errors: z.array(z.strictObject({ field: z.enum([...IMPORT_FIELDS, 'row']), message: z.string() })),
  message: z.string(),
});
export type ImportRowResult = z.infer<typeof importRowResultSchema>;

export const importPreviewSchema = z.strictObject({
  fileName: z.string(),
  format: z.enum(['csv', 'xlsx']),
  headerRow: z.number().int(),
  columns: z.array(z.strictObject({ index: z.number().int(), header: z.string(), samples: z.array(z.string()) })),
  mapping: importMappingSchema,
  suggestedMapping: importMappingSchema,
  mode: z.enum(IMPORT_MODES),
  rows: z.array(importRowResultSchema),
  summary: z.strictObject({
    create: z.number().int(),
    update: z.number().int(),
    unchanged: z.number().int(),
    skip: z.number().int(),
    error: z.number().int(),
  }),
});
export type ImportPreview = z.infer<typeof importPreviewSchema>;

export const importReportSchema = z.strictObject({
  mode: z.enum(IMPORT_MODES),
  created: z.array(z.strictObject({ row: z.number().int(), assetTag: z.string(), id: z.string() })),
  updated: z.array(z.strictObject({ row: z.number().int(), assetTag: z.string(), id: z.string(), changes: z.record(z.string(), change) })),
  skipped: z.array(z.strictObject({ row: z.number().int(), assetTag: z.string().nullable(), reason: z.string() })),
});
export type ImportReport = z.infer<typeof importReportSchema>;
