import { describe, expect, it } from 'vitest';
import { isBaselineSet } from '../../../shared/readings/baseline.js';

describe('isBaselineSet', () => {
  it('counts factory and commissioning sets, marked or not', () => {
    expect(isBaselineSet({ kind: 'factory', isReference: false })).toBe(true);
    expect(isBaselineSet({ kind: 'commissioning', isReference: false })).toBe(true);
  });

  it('counts a routine set only when it is marked as a reference', () => {
    expect(isBaselineSet({ kind: 'routine', isReference: false })).toBe(false);
    expect(isBaselineSet({ kind: 'routine', isReference: true })).toBe(true);
  });

  it('never counts a post-fault set, even one marked as a reference', () => {
    expect(isBaselineSet({ kind: 'post-fault', isReference: true })).toBe(false);
  });
});
