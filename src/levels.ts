// The four screening levels of the engine, in rising order of concern (the result format's `level` values).
import type { Level } from '../shared/schemas/result';

export type { Level };
export const LEVELS: readonly Level[] = ['ok', 'watch', 'investigate', 'critical'];
