import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { StripStatus } from '@shared/domain/progress';

export interface BoardStrip {
  id: string;
  label: string;
  zone: string | null;
  sortOrder: number;
  status: StripStatus;
  withdrawnReason: string | null;
  openFaults: number;
  total: number;
  done: number;
  passed: number;
  nearLimit: number;
  failed: number;
}

export interface BoardFault {
  id: string;
  stripId: string;
  stripLabel: string;
  positionName: string;
  equipment: { assetTag: string; lengthM: number | null } | null;
  kind: 'short' | 'open' | 'high-resistance' | 'intermittent';
  conductors: string;
  status: 'open' | 'located' | 'repaired' | 'closed';
  estimate: { distanceM: number; uncertaintyM: number; fromEnd: 'near' | 'far'; method: string } | null;
  openedAt: string;
}

export interface Board {
  venue: { id: string; name: string; status: string; eventId: string; eventName: string };
  counts: Record<StripStatus, number>;
  progress: { stepsDone: number; stepsTotal: number; percent: number };
  strips: BoardStrip[];
  openFaults: BoardFault[];
  generatedAt: string;
}

export const BOARD_REFRESH_MS = 5_000;

export const getBoard = (venueId: string) => api.get<Board>(`/venues/${venueId}/board`);
export const boardQueryOptions = (venueId: string) =>
  queryOptions({ queryKey: ['venues', venueId, 'board'], queryFn: () => getBoard(venueId) });
/** Polled so the board follows the technicians without a reload. */
export const useBoard = (venueId: string, opts: { poll?: boolean } = {}) =>
  useQuery({ ...boardQueryOptions(venueId), refetchInterval: opts.poll === false ? false : BOARD_REFRESH_MS, refetchIntervalInBackground: false });
