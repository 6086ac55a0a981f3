import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { faultsContracts, type FaultDetail } from '@shared/contracts/faults';

export type { FaultDetail };
export type FaultEstimateDto = FaultDetail['estimates'][number];
export type CombinedDto = NonNullable<FaultDetail['combined']>;

export const getFault = (faultId: string) => call(faultsContracts.get, { params: { id: faultId } });
export const faultQueryOptions = (faultId: string) => queryOptions({ queryKey: ['faults', faultId], queryFn: () => getFault(faultId) });
export const useFault = (faultId: string) => useQuery(faultQueryOptions(faultId));
