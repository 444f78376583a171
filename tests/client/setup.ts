// Client tests: a realistic wait on a loaded 2-core machine. vi.waitFor's default of 1 s is shorter than a lazy route's
// first transform under load, so every wait here defaults to 15 s (a wait that passes returns at once).
import { vi } from 'vitest';

const waitFor = vi.waitFor.bind(vi);
type Options = Parameters<typeof vi.waitFor>[1];
Object.assign(vi, {
  waitFor: (callback: Parameters<typeof vi.waitFor>[0], options?: Options) =>
    waitFor(callback, typeof options === 'number' ? options : { timeout: 15_000, interval: 20, ...options }),
});
