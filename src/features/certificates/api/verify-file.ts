import { useMutation } from '@tanstack/react-query';
import { apiRequest } from '@/lib/api-client';
import type { Verification } from './get-verification';

export type FileCheck = { match: false; sha256: string } | { match: true; sha256: string; certificate: Verification };

export const verifyFile = (file: File) => {
  const body = new FormData();
  body.append('file', file);
  return apiRequest<FileCheck>('/verify/file', { method: 'POST', body });
};
export const useVerifyFile = () => useMutation({ mutationFn: verifyFile });
