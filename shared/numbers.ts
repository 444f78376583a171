// Decimal numbers as people type them, in a form field or a CSV cell. A leaf module: no imports, so a form can use it
// without pulling a CSV parser or the engine into its chunk.

/** The one message for a number written with a decimal comma (forms and both importers use it). */
export const DECIMAL_COMMA_MESSAGE = 'decimal comma: use a point (3.14)';
/** The message for an empty text where a number is needed. */
export const REQUIRED_MESSAGE = 'required';
/** The message for a text that is no number. */
export const NOT_A_NUMBER_MESSAGE = 'not a number';

const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
// "3,14", ",5", "1.234,5" (a point as thousands separator and a comma as decimal mark).
const DECIMAL_COMMA = /^[+-]?(?:\d{1,3}(?:\.\d{3})+|\d*),\d+$/;

export type ParsedDecimal = { ok: true; value: number } | { ok: false; message: string };

/** A text read as a plain decimal number (a point as decimal mark, optional exponent): the number, or why not. */
export function parseDecimal(text: string): ParsedDecimal {
  const s = text.trim();
  if (s === '') return { ok: false, message: REQUIRED_MESSAGE };
  if (DECIMAL_COMMA.test(s)) return { ok: false, message: DECIMAL_COMMA_MESSAGE };
  if (!NUMBER.test(s)) return { ok: false, message: NOT_A_NUMBER_MESSAGE };
  const value = Number(s);
  if (!Number.isFinite(value)) return { ok: false, message: 'not a finite number' };
  return { ok: true, value };
}

/** True when a text looks like a number written with a decimal comma. */
export function isDecimalCommaNumber(text: string): boolean {
  return DECIMAL_COMMA.test(text.trim());
}
