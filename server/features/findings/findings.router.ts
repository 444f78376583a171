import { fileReply, route, type RouteDef } from '../../route-def.js';
import { findingAttachmentParams, findingParams } from '../../common/params.js';
import { UPLOAD_LIMITS } from '../../common/upload.js';
import { addFindingAttachment, getFindingAttachment } from '../attachments/attachments.service.js';
import { disposition } from '../../common/disposition.js';

// Photos and documents on inspection findings.
export const findingRoutes: RouteDef[] = [
  // POST /api/findings/:findingId/attachments — a JPEG, PNG, WebP or PDF (judged by its bytes), at most 10 MB
  route({
    method: 'post',
    path: '/findings/:findingId/attachments',
    access: ['engineer', 'admin'],
    upload: UPLOAD_LIMITS.findingFileBytes,
    params: findingParams,
    status: 201,
    handler: ({ m, clock, user, params, file }) => addFindingAttachment(m, clock, user.id, params.findingId, file),
  }),
  // GET /api/findings/:findingId/attachments/:attachmentId — download a finding's photo or document
  route({
    method: 'get',
    path: '/findings/:findingId/attachments/:attachmentId',
    access: 'signed-in',
    params: findingAttachmentParams,
    handler: async ({ m, params }) => {
      const a = await getFindingAttachment(m, params.findingId, params.attachmentId);
      return fileReply(a.data, a.contentType, { 'Content-Disposition': disposition(a.name, { utf8: 'always' }), 'X-Content-SHA256': a.sha256 });
    },
  }),
];
