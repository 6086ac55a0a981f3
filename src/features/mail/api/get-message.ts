import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { MailSummary } from './get-messages';

export const getMessage = (id: number) => api.get<MailSummary & { text: string }>(`/mail/${id}`);
export const messageQueryOptions = (id: number) => queryOptions({ queryKey: ['mail', id], queryFn: () => getMessage(id) });
export const useMessage = (id: number | null) => useQuery({ ...messageQueryOptions(id ?? 0), enabled: id !== null });
