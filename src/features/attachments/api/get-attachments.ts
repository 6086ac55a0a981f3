import { queryOptions, useQuery } from '@tanstack/react-query';
import { call } from '@/lib/api-client';
import { attachmentsContracts } from '@shared/contracts/attachments';
import type { AttachmentOwnerType } from '@shared/schemas/attachments';

export const getAttachments = (ownerType: AttachmentOwnerType, ownerId: string) =>
  call(attachmentsContracts[ownerType].list, { params: { id: ownerId } });

export const attachmentsQueryOptions = (ownerType: AttachmentOwnerType, ownerId: string) =>
  queryOptions({ queryKey: ['attachments', ownerType, ownerId], queryFn: () => getAttachments(ownerType, ownerId) });

export const useAttachments = (ownerType: AttachmentOwnerType, ownerId: string) => useQuery(attachmentsQueryOptions(ownerType, ownerId));
