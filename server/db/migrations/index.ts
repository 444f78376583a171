import { Init1796178199079 } from './1796178199079-init.js';
import { CriteriaV11796178199080 } from './1796178199080-criteria-v1.js';
import { NotificationRetry1796181914464 } from './1796181914464-notification-retry.js';
import { RulesRevision2Fields1796221430119 } from './1796221430119-rules-revision-2-fields.js';
import { CriteriaV21796221430120 } from './1796221430120-criteria-v2.js';
import { EnergisedAndRestrictions1796228231379 } from './1796228231379-energised-and-restrictions.js';
import { DecisionMail1796230108026 } from './1796230108026-decision-mail.js';
import { MustChangePassword1796234400000 } from './1796234400000-must-change-password.js';
import { SiteLocale1796300000000 } from './1796300000000-site-locale.js';
import { TokenVersion1796410000000 } from './1796410000000-token-version.js';
import { SecurityEvent1796410000001 } from './1796410000001-security-event.js';
import { AuditChain1796420000000 } from './1796420000000-audit-chain.js';
import { UnitSortIndexes1796430000000 } from './1796430000000-unit-sort-indexes.js';

// Migrations in order, imported as classes (globs of .ts files break under vitest).
export const migrations = [Init1796178199079, CriteriaV11796178199080, NotificationRetry1796181914464, RulesRevision2Fields1796221430119, CriteriaV21796221430120, EnergisedAndRestrictions1796228231379, DecisionMail1796230108026, MustChangePassword1796234400000, SiteLocale1796300000000, TokenVersion1796410000000, SecurityEvent1796410000001, AuditChain1796420000000, UnitSortIndexes1796430000000];
