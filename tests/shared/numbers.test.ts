import { describe, expect, it } from 'vitest';
import { DECIMAL_COMMA_MESSAGE, isDecimalCommaNumber, parseDecimal } from '../../shared/numbers.js';

describe('parseDecimal', () => {
  it('reads numbers written with a point, a sign or an exponent', () => {
    expect(parseDecimal('3.14')).toEqual({ ok: true, value: 3.14 });
    expect(parseDecimal(' -0.5 ')).toEqual({ ok: true, value: -0.5 });
    expect(parseDecimal('.5')).toEqual({ ok: true, value: 0.5 });
    expect(parseDecimal('1e3')).toEqual({ ok: true, value: 1000 });
  });

  it('names a decimal comma with the one message', () => {
    expect(DECIMAL_COMMA_MESSAGE).toBe('decimal comma: use a point (3.14)');
    for (const text of ['3,14', ',5', '1.234,5']) {
      expect(parseDecimal(text)).toEqual({ ok: false, message: DECIMAL_COMMA_MESSAGE });
      expect(isDecimalCommaNumber(text)).toBe(true);
    }
    expect(isDecimalCommaNumber('3.14')).toBe(false);
  });

  it('says required for an empty text and not a number for words', () => {
    expect(parseDecimal('  ')).toEqual({ ok: false, message: 'required' });
    expect(parseDecimal('abc')).toEqual({ ok: false, message: 'not a number' });
    expect(parseDecimal('1.2.3')).toEqual({ ok: false, message: 'not a number' });
    expect(parseDecimal('1e999')).toEqual({ ok: false, message: 'not a finite number' });
  });
});
