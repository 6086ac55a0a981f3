import { useMutation } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { certificatesContracts, type FileCheck } from '@shared/contracts/certificates';

export type { FileCheck };

export const verifyFile = (file: File) => {
  const body = new FormData();
  body.append('file', file);
  return call(certificatesContracts.verifyFile, { body });
};
export const useVerifyFile = () => useMutation({ mutationFn: verifyFile });
