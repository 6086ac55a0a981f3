import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { mailContracts } from '@shared/contracts/mail';

export const getMessage = (id: number) => call(mailContracts.get, { params: { id: String(id) } });
export const messageQueryOptions = (id: number) => queryOptions({ queryKey: ['mail', id], queryFn: () => getMessage(id) });
export const useMessage = (id: number | null) => useQuery({ ...messageQueryOptions(id ?? 0), enabled: id !== null });
