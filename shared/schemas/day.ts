import { z } from 'zod';

// Public responses say on which day something happened, never at what time:
// next to a handle, a time of day says where someone was when.

/** A calendar day, YYYY-MM-DD (UTC). */
export const day = z.string().regex(/^\d{4}-\d{2}-\d{2}$/);

/** The day (UTC) of a time. */
export function dayOf(value: Date | string | number): string {
  return new Date(value).toISOString().slice(0, 10);
}
