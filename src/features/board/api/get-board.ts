import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { boardContracts, type Board } from '@shared/contracts/board';

export type { Board };
export type BoardStrip = Board['strips'][number];
export type BoardFault = Board['openFaults'][number];

export const BOARD_REFRESH_MS = 5_000;

export const getBoard = (venueId: string) => call(boardContracts.get, { params: { id: venueId } });
export const boardQueryOptions = (venueId: string) =>
  queryOptions({ queryKey: ['venues', venueId, 'board'], queryFn: () => getBoard(venueId) });
/** Polled so the board follows the technicians without a reload. */
export const useBoard = (venueId: string, opts: { poll?: boolean } = {}) =>
  useQuery({
    ...boardQueryOptions(venueId),
    refetchInterval: opts.poll === false ? false : BOARD_REFRESH_MS,
    refetchIntervalInBackground: false,
  });
