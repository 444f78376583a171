// Numbers typed in the administration forms: read with the shared parser; a text that is no number goes to the body as
// NaN (the schema refuses it) and its reason shows on the field.
import { parseDecimal } from '../../../shared/numbers';

/** The number typed, or NaN. */
export function numberOf(text: string): number {
  const parsed = parseDecimal(text);
  return parsed.ok ? parsed.value : Number.NaN;
}

/** The number typed, undefined when the field is empty (the server fills it in), or NaN. */
export function optionalNumberOf(text: string): number | undefined {
  return text.trim() === '' ? undefined : numberOf(text);
}

/** Why each typed number does not read (`required` fields must not be empty), by field name. */
export function numberErrors(fields: Record<string, string>, required: readonly string[]): Record<string, string> {
  const errors: Record<string, string> = {};
  for (const [field, text] of Object.entries(fields)) {
    if (text.trim() === '' && !required.includes(field)) continue;
    const parsed = parseDecimal(text);
    if (!parsed.ok) errors[field] = parsed.message;
  }
  return errors;
}

/** A stored number as the form shows it. */
export const textOf = (n: number | null | undefined): string => (n === null || n === undefined ? '' : String(n));
