import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CreateReadingInput, ReadingDto } from '@shared/schemas/readings';
import { stripQueryOptions, type StripDetail } from './get-strip';

export const createReading = (body: CreateReadingInput) => api.post<ReadingDto>('/readings', body as unknown as Record<string, unknown>);

/** Records a reading; the stored verdict replaces the browser's preview at once, then the strip reloads. */
export const useCreateReading = (stripId: string) => {
  const qc = useQueryClient();
  const key = stripQueryOptions(stripId).queryKey;
  return useMutation({
    mutationFn: createReading,
    onSuccess: (reading) => {
      qc.setQueryData<StripDetail>(key, (old) =>
        old && {
          ...old,
          positions: old.positions.map((p) => ({ ...p, steps: p.steps.map((s) => (s.id === reading.stepId ? { ...s, latest: reading } : s)) })),
        },
      );
      void qc.invalidateQueries({ queryKey: key });
      // Lists and boards elsewhere show progress from the same readings.
      void qc.invalidateQueries({ queryKey: ['venues'] });
    },
  });
};
