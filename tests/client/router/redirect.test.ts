import { describe, expect, it } from 'vitest';
import { safeRedirect } from '../../../src/router/redirect';

describe('safeRedirect', () => {
  it('follows a path inside the app, query included', () => {
    expect(safeRedirect('/units/7?tab=events')).toBe('/units/7?tab=events');
  });

  it('takes the first value when the query repeats the parameter', () => {
    expect(safeRedirect(['/criteria', '/admin'])).toBe('/criteria');
  });

  it.each([
    ['an absolute URL', 'https://evil.example/'],
    ['a protocol-relative URL', '//evil.example/x'],
    ['a backslash trick', '/\\evil.example'],
    ['a relative path', 'units'],
    ['nothing', undefined],
  ])('refuses %s', (_what, value) => {
    expect(safeRedirect(value)).toBeNull();
  });
});
