import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export interface MailSummary {
  id: number;
  fromAddress: string;
  toAddresses: string;
  subject: string;
  receivedAt: string;
}

export const getMessages = () => api.get<MailSummary[]>('/mail');
export const messagesQueryOptions = () => queryOptions({ queryKey: ['mail'], queryFn: getMessages, refetchInterval: 5000 });
export const useMessages = () => useQuery(messagesQueryOptions());
