import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { authContracts } from '@shared/contracts/auth';
import type { SetPasswordInput } from '@shared/schemas/auth';

export const getLinkInfo = (token: string) => call(authContracts.linkInfo, { params: { token } });

export const linkInfoQueryOptions = (token: string) =>
  queryOptions({ queryKey: ['auth', 'link', token], queryFn: () => getLinkInfo(token), retry: false });

export const useLinkInfo = (token: string) => useQuery(linkInfoQueryOptions(token));

export const setPassword = ({ token, ...input }: SetPasswordInput & { token: string }) =>
  call(authContracts.setPassword, { params: { token }, body: input });

export const useSetPassword = () => useMutation({ mutationFn: setPassword });
