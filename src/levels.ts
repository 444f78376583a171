// The four screening levels of the engine, in rising order of concern (the result format's `level` values).
export const LEVELS = ['ok', 'watch', 'investigate', 'critical'] as const;
export type Level = (typeof LEVELS)[number];
