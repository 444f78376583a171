import { z } from 'zod';

// Building blocks of the API answers' schemas.

/** A time as the API writes it: ISO 8601 in UTC (`2026-07-01T03:12:00.000Z`). */
export const isoDateTime = z.iso.datetime();
/** A row id. */
export const rowId = z.number().int().positive();

/** One page of a list: the items, how many there are in all, and which page of what size this is. */
export const pageOf = <T extends z.ZodType>(item: T) =>
  z.strictObject({
    items: z.array(item),
    total: z.number().int().nonnegative(),
    page: z.number().int().positive(),
    pageSize: z.number().int().positive(),
  });
