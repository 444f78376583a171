import { z } from 'zod';

// Route parameter schemas, each named for the id it carries.
const id = () => z.coerce.number().int().positive('not a valid id');

export const eventParams = z.object({ eventId: id() });
export const sessionParams = z.object({ sessionId: id() });
export const screeningParams = z.object({ screeningId: id() });
export const followUpParams = z.object({ followUpId: id() });
export const unitParams = z.object({ unitId: id() });
export const designParams = z.object({ designId: id() });
export const siteParams = z.object({ siteId: id() });
export const userParams = z.object({ userId: id() });
export const sweepParams = z.object({ sweepId: id() });
export const readingSetParams = z.object({ readingSetId: id() });
export const attachmentParams = z.object({ eventId: id(), attachmentId: id() });
export const findingParams = z.object({ findingId: id() });
export const findingAttachmentParams = z.object({ findingId: id(), attachmentId: id() });
export const notificationParams = z.object({ notificationId: id() });
export const outboxAttachmentParams = z.object({ messageId: id(), index: z.coerce.number().int().nonnegative('not a valid index') });
