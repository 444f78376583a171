import { AppSetting } from '../common/app-setting.entity.js';
import { AuditEntry } from '../common/audit-entry.entity.js';
import { SinkMessage } from '../mail/sink-message.entity.js';
import { Site } from '../features/sites/site.entity.js';
import { User } from '../features/users/user.entity.js';

// Every entity the data source knows (imported as classes: globs of .ts files break under vitest).
export const entities = [AppSetting, AuditEntry, SinkMessage, Site, User];
