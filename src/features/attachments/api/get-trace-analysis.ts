import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { attachmentsContracts } from '@shared/contracts/attachments';

export const getTraceAnalysis = (attachmentId: string) => call(attachmentsContracts.analysis, { params: { id: attachmentId } });

export const traceAnalysisQueryOptions = (attachmentId: string) =>
  queryOptions({ queryKey: ['attachments', 'analysis', attachmentId], queryFn: () => getTraceAnalysis(attachmentId), staleTime: Infinity });

export const useTraceAnalysis = (attachmentId: string) => useQuery(traceAnalysisQueryOptions(attachmentId));
