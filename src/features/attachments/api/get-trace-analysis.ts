import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { TraceAnalysisDto } from '@shared/schemas/attachments';

export const getTraceAnalysis = (attachmentId: string) => api.get<TraceAnalysisDto>(`/attachments/${attachmentId}/analysis`);

export const traceAnalysisQueryOptions = (attachmentId: string) =>
  queryOptions({ queryKey: ['attachments', 'analysis', attachmentId], queryFn: () => getTraceAnalysis(attachmentId), staleTime: Infinity });

export const useTraceAnalysis = (attachmentId: string) => useQuery(traceAnalysisQueryOptions(attachmentId));
