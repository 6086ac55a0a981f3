import { useMutation } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api-client';
import type { WaveformAnswer } from '@shared/schemas/waveforms';

export type { WaveformAnswer };

export interface AnalyseWaveformInput {
  file: Blob;
  velocityFactor?: number | undefined;
  lengthM?: number | undefined;
}

export const analyseWaveform = ({ file, velocityFactor, lengthM }: AnalyseWaveformInput) => {
  const query = new URLSearchParams();
  if (velocityFactor !== undefined) query.set('velocityFactor', String(velocityFactor));
  if (lengthM !== undefined) query.set('lengthM', String(lengthM));
  const qs = query.size > 0 ? `?${query}` : '';
  // Re-typed as text/csv: browsers label .csv files inconsistently (Windows says vnd.ms-excel).
  return apiRequest<WaveformAnswer>(`/waveforms/analyse${qs}`, { method: 'POST', body: new Blob([file], { type: 'text/csv' }) });
};

export const useAnalyseWaveform = () => useMutation({ mutationFn: analyseWaveform });
