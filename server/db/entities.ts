import { AppSetting } from '../common/app-setting.entity.js';
import { AuditEntry } from '../common/audit-entry.entity.js';
import { Attachment } from '../features/attachments/attachment.entity.js';
import { AttachmentContent } from '../features/attachments/attachment-content.entity.js';
import { CriteriaSet } from '../features/criteria/criteria-set.entity.js';
import { Design } from '../features/designs/design.entity.js';
import { FaultEvent } from '../features/events/fault-event.entity.js';
import { Notification } from '../features/notifications/notification.entity.js';
import { Reading } from '../features/readings/reading.entity.js';
import { ReadingSet } from '../features/readings/reading-set.entity.js';
import { SweepTrace } from '../features/readings/sweep-trace.entity.js';
import { Decision } from '../features/screenings/decision.entity.js';
import { Finding } from '../features/screenings/finding.entity.js';
import { FollowUp } from '../features/screenings/follow-up.entity.js';
import { Screening } from '../features/screenings/screening.entity.js';
import { Site } from '../features/sites/site.entity.js';
import { Unit } from '../features/units/unit.entity.js';
import { User } from '../features/users/user.entity.js';
import { SinkAttachment } from '../mail/sink-attachment.entity.js';
import { SinkMessage } from '../mail/sink-message.entity.js';
import { SecurityEvent } from '../features/security/security-event.entity.js';

// Every entity the data source knows (imported as classes: globs of .ts files break under vitest).
export const entities = [
  AppSetting,
  AuditEntry,
  Attachment,
  AttachmentContent,
  CriteriaSet,
  Decision,
  Design,
  FaultEvent,
  Finding,
  FollowUp,
  Notification,
  Reading,
  ReadingSet,
  Screening,
  Site,
  SinkAttachment,
  SinkMessage,
  SweepTrace,
  Unit,
  User,
  SecurityEvent,
];
