import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

export const endSessions = (id: string) => api.post<void>(`/users/${id}/end-sessions`);

export const useEndSessions = () => useMutation({ mutationFn: endSessions });
