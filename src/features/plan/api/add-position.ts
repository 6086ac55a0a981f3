import { call } from '@/lib/api-client';
import { planContracts } from '@shared/contracts/plan';
import type { AddPositionInput } from '@shared/schemas/plan';
import { ifMatch, usePlanEdit } from './plan-edit';

type Vars = { stripId: string; position: AddPositionInput };
export const addPosition = ({ stripId, position, version }: Vars & { version: number }) =>
  call(planContracts.addPosition, { params: { id: stripId }, body: position, headers: ifMatch(version) });
export const useAddPosition = (venueId: string) => usePlanEdit<Vars>(venueId, addPosition);
