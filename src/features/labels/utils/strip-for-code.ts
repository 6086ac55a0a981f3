import { ApiError } from '@/lib/api-client';
import type { ScannedCode } from '@shared/domain/label-codes';
import { lookupTag, type TagLookup } from '../api/lookup-tag';

export type CodeOutcome =
  { kind: 'strip'; stripId: string } | { kind: 'item'; item: TagLookup } | { kind: 'unknown-tag'; assetTag: string };

/** A strip's code as it is; a tag looked up (an unknown tag is an outcome, not an error). */
export async function resolveCode(code: ScannedCode): Promise<CodeOutcome> {
  if (code.kind === 'strip') return code;
  try {
    return { kind: 'item', item: await lookupTag(code.assetTag) };
  } catch (err) {
    if (err instanceof ApiError && err.status === 404) return { kind: 'unknown-tag', assetTag: code.assetTag };
    throw err;
  }
}

/**
 * The strip a code opens on the testing screen: the strip itself, or the strip an item sits on,
 * in this venue first; else a sentence saying why there is none.
 */
export async function stripForCode(code: ScannedCode, venueId?: string): Promise<{ stripId: string } | { message: string }> {
  const found = await resolveCode(code);
  if (found.kind === 'strip') return { stripId: found.stripId };
  if (found.kind === 'unknown-tag') return { message: `No item in the register has the tag ${found.assetTag}.` };
  const { placements, assetTag } = found.item;
  const here = placements.find((p) => p.venueId === venueId) ?? (placements.length === 1 ? placements[0] : undefined);
  if (here) return { stripId: here.stripId };
  if (placements.length === 0) return { message: `${assetTag} is not on a strip of a venue you test.` };
  return {
    message: `${assetTag} is on strips of several venues: ${placements.map((p) => `${p.stripLabel} (${p.venueName})`).join(', ')}. Open the venue first.`,
  };
}
