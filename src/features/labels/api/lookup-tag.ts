import { call } from '@/lib/api-client';
import { labelsContracts, type TagLookup } from '@shared/contracts/labels';

export type { TagLookup };

/** Where a scanned or typed tag leads; asked once per scan, so not kept as a query. */
export const lookupTag = (assetTag: string) => call(labelsContracts.lookupTag, { params: { tag: assetTag } });
