// The uploaders' progress line (hand-computed values in each check).
import { describe, expect, it } from 'vitest';
import { formatBytes, groupDigits, uploadProgressView } from '../../../shared/imports/upload-progress.js';

describe('uploadProgressView', () => {
  it('shows the share sent, rounded down (450 000 of 1 000 000 bytes = 45 %)', () => {
    expect(uploadProgressView(450_000, 1_000_000, 5000, 'readings')).toEqual({ ratio: 0.45, text: 'Uploading… 45 % of 1.0 MB', checking: false });
  });

  it('once every byte is sent, says the server is checking the rows, counted with a space between thousands', () => {
    expect(uploadProgressView(2_097_152, 2_097_152, 5000, 'readings')).toEqual({ ratio: 1, text: 'Checking 5 000 readings…', checking: true });
    expect(uploadProgressView(10, 10, 1, 'readings').text).toBe('Checking 1 reading…');
    expect(uploadProgressView(10, 10, null).text).toBe('Checking the rows…');
  });

  it('without a known total: an indeterminate bar and the bytes sent', () => {
    expect(uploadProgressView(0, 0, null)).toEqual({ ratio: null, text: 'Uploading…', checking: false });
    expect(uploadProgressView(2500, 0, null).text).toBe('Uploading… 2.5 kB sent');
  });
});

describe('formatBytes and groupDigits', () => {
  it('decimal units as browsers show sizes (common practice), thousands grouped by a space', () => {
    expect([formatBytes(999), formatBytes(1500), formatBytes(25_000), formatBytes(2_097_152)]).toEqual(['999 B', '1.5 kB', '25 kB', '2.1 MB']);
    expect([groupDigits(999), groupDigits(5000), groupDigits(1_234_567)]).toEqual(['999', '5 000', '1 234 567']);
  });
});
