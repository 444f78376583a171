import { z } from 'zod';

/** The `format` query of the export routes (readings, indicators, audit trail). */
export const exportFormatQuerySchema = z.object({ format: z.enum(['xlsx', 'csv'], { message: 'xlsx or csv' }).default('xlsx') });
