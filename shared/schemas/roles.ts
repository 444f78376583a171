import { z } from 'zod';

// The five roles of the brief; a user may hold several.
export const ROLES = ['admin', 'protection', 'tester', 'manager', 'engineer'] as const;
export const roleSchema = z.enum(ROLES);
export type Role = z.infer<typeof roleSchema>;
