import type { SecurityEventKind } from '../schemas/responses/security.js';

// The security log's kinds of event in words (the administration's "Security log").
export const SECURITY_EVENT_LABELS: Record<SecurityEventKind, string> = {
  sign_in_failed: 'Sign-in failed',
  sign_in_locked: 'Sign-in refused: account locked',
  account_locked: 'Account locked after repeated failures',
  account_unlocked: 'Sign-in lock ended by an administrator',
  sign_in_throttled: 'Sign-in refused: too many attempts from this address',
  access_refused: 'Access refused: role not held',
};

export function securityEventLabel(kind: string): string {
  return (SECURITY_EVENT_LABELS as Record<string, string>)[kind] ?? 'Security event';
}
