// E-mails about an event: resend one from the event's e-mail log.
import type { ResentNotification } from '../../shared/schemas/responses';
import { api } from './client';

export type { ResentNotification };

// POST /api/notifications/:id/resend — queues a fresh copy (manager, admin).
export function resendNotification(notificationId: number): Promise<ResentNotification> {
  return api.post<ResentNotification>(`/notifications/${notificationId}/resend`);
}
