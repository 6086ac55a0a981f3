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

export interface AttachmentCreated {
  id: string;
  kind: AttachmentKind;
  contentType: string;
  size: number;
  sha256: string;
}

export interface AttachmentDto extends AttachmentCreated {
  ownerType: AttachmentOwnerType;
  ownerId: string;
  originalName: string;
  hasPreview: boolean;
  createdAt: string;
  createdBy: string;
  createdByName: string | null;
  url: string;
  previewUrl: string | null;
  analysisUrl: string | null;
}

export interface TraceAnalysisDto {
  attachmentId: string;
  originalName: string;
  sampleCount: number;
  skippedLines: number;
  velocityFactor: number | null;
  velocityFactorSource: string | null;
  lengthM: number | null;
  /** Downsampled for the plot (min/max per bucket), seconds and volts. */
  points: { timeS: number[]; volts: number[] };
  /** The automatic analysis, or null when the engine could not find the edges (see problem). */
  analysis: {
    incidentTimeS: number;
    reflectionTimeS: number | null;
    roundTripNs: number | null;
    polarity: 'open' | 'short' | null;
    reflectionCoefficient: number | null;
    riseTimeNs: number;
    sampleIntervalNs: number;
    distanceM: number | null;
    uncertaintyM: number | null;
    message: string;
  } | null;
  problem: string | null;
}
