import { useMutation } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { usersContracts } from '@shared/contracts/users';

export const endSessions = (id: string) => call(usersContracts.endSessions, { params: { id } });

export const useEndSessions = () => useMutation({ mutationFn: endSessions });
