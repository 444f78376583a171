// Transformer protections of the case format and which of them are the transformer's own (internal) protections.
// A leaf module (no imports): the criteria sets build their internal-protection list from it, and the client and the
// reports read it without loading the engine or a schema library.

/** Every protection a fault may record as operated (case format `fault.protectionOperated`). */
export const PROTECTIONS = [
  'differential',
  'restricted-earth-fault',
  'buchholz-alarm',
  'buchholz-trip',
  'sudden-pressure',
  'pressure-relief',
  'overcurrent',
] as const;
export type ProtectionCode = (typeof PROTECTIONS)[number];

/**
 * The internal protections of the built-in criteria sets: any of them operating means an internal fault is suspected
 * and the recommendation is no-go. A stored criteria set carries its own copy (`verdict.internalProtections`).
 */
export const INTERNAL_PROTECTIONS: readonly ProtectionCode[] = [
  'differential',
  'restricted-earth-fault',
  'buchholz-trip',
  'sudden-pressure',
  'pressure-relief',
];

/** Whether a protection is internal under a criteria set's list (the built-in list by default). */
export function isInternalProtection(p: string, internal: readonly string[] = INTERNAL_PROTECTIONS): boolean {
  return internal.includes(p);
}
