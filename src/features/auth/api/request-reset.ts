import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const requestReset = (input: { email: string }) => api.post<{ detail: string }>('/auth/password-reset', input);

export const useRequestReset = () => useMutation({ mutationFn: requestReset });
