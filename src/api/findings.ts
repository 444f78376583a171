// Photos and documents on inspection findings — POST /api/findings/:id/attachments (JPEG, PNG, WebP or PDF, judged by
// the server from the bytes; 413 too large, 415 another type; the picker's filter is shared/uploads/file-types.ts
// `UPLOAD_TYPES.findingFile`) and GET …/:attachmentId (the bytes, with the token).
import type { AttachmentView, EventFinding } from '../../shared/schemas/responses';
import { api } from './client';

export type { EventFinding };
export type FindingAttachment = AttachmentView;

export function addFindingAttachment(findingId: number, file: File): Promise<FindingAttachment> {
  return api.upload<FindingAttachment>(`/findings/${findingId}/attachments`, { file, name: file.name });
}

export function downloadFindingAttachment(findingId: number, attachmentId: number): Promise<Blob> {
  return api.download(`/findings/${findingId}/attachments/${attachmentId}`);
}
