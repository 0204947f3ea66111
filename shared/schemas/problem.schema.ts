import { z } from 'zod';

/** The one error body every API error uses (after RFC 9457's problem details, in a small form). */
export const problemSchema = z.object({
  status: z.number().int(),
  title: z.string(),
  detail: z.string(),
  errors: z.array(z.object({ path: z.string(), message: z.string() })).default([]),
});
export type Problem = z.infer<typeof problemSchema>;
