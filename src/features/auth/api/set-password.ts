import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { PublicUser, SetPasswordInput } from '@shared/schemas/auth';

export const getLinkInfo = (token: string) =>
  api.get<{ email: string; name: string; purpose: 'invite' | 'reset' }>(`/auth/set-password/${encodeURIComponent(token)}`);

export const linkInfoQueryOptions = (token: string) =>
  queryOptions({ queryKey: ['auth', 'link', token], queryFn: () => getLinkInfo(token), retry: false });

export const useLinkInfo = (token: string) => useQuery(linkInfoQueryOptions(token));

export const setPassword = ({ token, ...input }: SetPasswordInput & { token: string }) =>
  api.post<{ user: PublicUser }>(`/auth/set-password/${encodeURIComponent(token)}`, input);

export const useSetPassword = () => useMutation({ mutationFn: setPassword });
