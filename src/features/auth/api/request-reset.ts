import { useMutation } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { authContracts } from '@shared/contracts/auth';

export const requestReset = (input: { email: string }) => call(authContracts.requestReset, { body: input });

export const useRequestReset = () => useMutation({ mutationFn: requestReset });
