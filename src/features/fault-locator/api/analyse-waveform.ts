import { useMutation } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { faultLocationContracts, type WaveformAnswer } from '@shared/contracts/fault-location';

export type { WaveformAnswer };

export interface AnalyseWaveformInput {
  file: Blob;
  velocityFactor?: number | undefined;
  lengthM?: number | undefined;
}

export const analyseWaveform = ({ file, velocityFactor, lengthM }: AnalyseWaveformInput) =>
  // Re-typed as text/csv: browsers label .csv files inconsistently (Windows says vnd.ms-excel).
  call(faultLocationContracts.analyse, { query: { velocityFactor, lengthM }, body: new Blob([file], { type: 'text/csv' }) });

export const useAnalyseWaveform = () => useMutation({ mutationFn: analyseWaveform });
