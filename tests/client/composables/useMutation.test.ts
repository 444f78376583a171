// The failure text of a change: the server's message, with the field messages it does not already say.
import { describe, expect, it } from 'vitest';
import { ApiError } from '../../../src/api/client';
import { errorText } from '../../../src/composables/useMutation';

describe('errorText', () => {
  it('is the message alone when the fields add nothing (a 415 repeats its message under `file`)', () => {
    const m = 'notes.docx is not a relay record: pick a COMTRADE (.cfg, .dat, .cff), CSV (.csv), text (.txt) or PDF (.pdf) file.';
    expect(errorText(new ApiError(415, 'unsupported_file_type', m, { file: m }))).toBe(m);
    expect(errorText(new ApiError(409, 'invalid_status', 'The event is released.'))).toBe('The event is released.');
  });

  it('adds the field messages, their places in words, at most three and how many more', () => {
    const e = new ApiError(400, 'invalid_file', 'The file has errors; nothing was imported.', {
      'row 3.value': 'decimal comma: use a point (3.14)',
      'row 5.unit': 'pF or nF',
      header: 'expected quantity,configuration,phase,value,unit',
      more: '4 more rows',
      file: 'required',
    });
    expect(errorText(e)).toBe(
      'The file has errors; nothing was imported (Row 3, value: decimal comma: use a point (3.14); Row 5, unit: pF or nF; Header: expected quantity,configuration,phase,value,unit; and 2 more).',
    );
  });
});
