import { z } from 'zod';

export const auditQuerySchema = z.object({
  entityType: z.string().trim().min(1).max(40).optional(),
  entityId: z.string().trim().min(1).max(80).optional(),
});
