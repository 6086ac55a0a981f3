// Attachments on faults, repairs and register items: what may be uploaded, how large, and the
// answers the client reads. Limits are per kind (OWASP ASVS 5.2.1).
import { z } from 'zod';

export const ATTACHMENT_OWNER_TYPES = ['fault', 'repair', 'equipment'] as const;
export type AttachmentOwnerType = (typeof ATTACHMENT_OWNER_TYPES)[number];
export const ATTACHMENT_KINDS = ['photo', 'trace', 'pdf'] as const;
export type AttachmentKind = (typeof ATTACHMENT_KINDS)[number];

const MB = 1024 * 1024;
export const ATTACHMENT_MAX_BYTES: Record<AttachmentKind, number> = {
  photo: 15 * MB,
  trace: 64 * MB,
  pdf: 20 * MB,
};
export const ATTACHMENT_ABSOLUTE_MAX_BYTES = Math.max(...Object.values(ATTACHMENT_MAX_BYTES));

/** File name extension → the kind and the content type its bytes must have. */
export const ATTACHMENT_EXTENSIONS: Record<string, { kind: AttachmentKind; contentType: string }> = {
  jpg: { kind: 'photo', contentType: 'image/jpeg' },
  jpeg: { kind: 'photo', contentType: 'image/jpeg' },
  png: { kind: 'photo', contentType: 'image/png' },
  webp: { kind: 'photo', contentType: 'image/webp' },
  heic: { kind: 'photo', contentType: 'image/heic' },
  heif: { kind: 'photo', contentType: 'image/heif' },
  csv: { kind: 'trace', contentType: 'text/csv' },
  txt: { kind: 'trace', contentType: 'text/csv' },
  pdf: { kind: 'pdf', contentType: 'application/pdf' },
};

/** For the file picker's accept attribute. */
export const ATTACHMENT_ACCEPT = Object.keys(ATTACHMENT_EXTENSIONS)
  .map((e) => `.${e}`)
  .join(',');

export function extensionOf(name: string): string {
  const dot = name.lastIndexOf('.');
  return dot <= 0 ? '' : name.slice(dot + 1).toLowerCase();
}

export const idempotencyKeyHeader = z.uuid({ error: 'Idempotency-Key must be a UUID.' });

export const attachmentCreatedSchema = z.strictObject({
  id: z.string(),
  kind: z.enum(ATTACHMENT_KINDS),
  contentType: z.string(),
  size: z.number().int(),
  sha256: z.string(),
});
export type AttachmentCreated = z.infer<typeof attachmentCreatedSchema>;

export const attachmentDtoSchema = z.strictObject({
  ...attachmentCreatedSchema.shape,
  ownerType: z.enum(ATTACHMENT_OWNER_TYPES),
  ownerId: z.string(),
  originalName: z.string(),
  hasPreview: z.boolean(),
  createdAt: z.string(),
  createdBy: z.string(),
  createdByName: z.string().nullable(),
  url: z.string(),
  previewUrl: z.string().nullable(),
  analysisUrl: z.string().nullable(),
});
export type AttachmentDto = z.infer<typeof attachmentDtoSchema>;

export const traceAnalysisDtoSchema = z.strictObject({
  attachmentId: z.string(),
  originalName: z.string(),
  sampleCount: z.number().int(),
  skippedLines: z.number().int(),
  velocityFactor: z.number().nullable(),
  velocityFactorSource: z.string().nullable(),
  lengthM: z.number().nullable(),
  /** Downsampled for the plot (min/max per bucket), seconds and volts. */
  points: z.strictObject({ timeS: z.array(z.number()), volts: z.array(z.number()) }),
  /** The automatic analysis, or null when the engine could not find the edges (see problem). */
  analysis: z
    .strictObject({
      incidentTimeS: z.number(),
      reflectionTimeS: z.number().nullable(),
      roundTripNs: z.number().nullable(),
      polarity: z.enum(['open', 'short']).nullable(),
      reflectionCoefficient: z.number().nullable(),
      riseTimeNs: z.number(),
      sampleIntervalNs: z.number(),
      distanceM: z.number().nullable(),
      uncertaintyM: z.number().nullable(),
      message: z.string(),
    })
    .nullable(),
  problem: z.string().nullable(),
});
export type TraceAnalysisDto = z.infer<typeof traceAnalysisDtoSchema>;
