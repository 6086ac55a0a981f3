import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { AttachmentDto, AttachmentOwnerType } from '@shared/schemas/attachments';

const segment: Record<AttachmentOwnerType, string> = { fault: 'faults', repair: 'repairs', equipment: 'equipment' };

export const attachmentsPath = (ownerType: AttachmentOwnerType, ownerId: string) => `/${segment[ownerType]}/${ownerId}/attachments`;

export const getAttachments = (ownerType: AttachmentOwnerType, ownerId: string) => api.get<AttachmentDto[]>(attachmentsPath(ownerType, ownerId));

export const attachmentsQueryOptions = (ownerType: AttachmentOwnerType, ownerId: string) =>
  queryOptions({ queryKey: ['attachments', ownerType, ownerId], queryFn: () => getAttachments(ownerType, ownerId) });

export const useAttachments = (ownerType: AttachmentOwnerType, ownerId: string) => useQuery(attachmentsQueryOptions(ownerType, ownerId));
