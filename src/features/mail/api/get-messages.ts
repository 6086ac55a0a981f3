import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { mailContracts, type MailSummary } from '@shared/contracts/mail';

export type { MailSummary };

export const getMessages = () => call(mailContracts.list);
export const messagesQueryOptions = () => queryOptions({ queryKey: ['mail'], queryFn: getMessages, refetchInterval: 5000 });
export const useMessages = () => useQuery(messagesQueryOptions());
