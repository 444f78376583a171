import { z } from 'zod';

// Route parameter schemas used by many routes.
export const idParams = z.object({ id: z.coerce.number().int().positive('not a valid id') });
export type IdParams = z.infer<typeof idParams>;
export const attachmentParams = idParams.extend({ attachmentId: z.coerce.number().int().positive('not a valid id') });
