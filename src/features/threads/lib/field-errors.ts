import type { z } from 'zod';
import { ApiError } from '@/lib/api-client';

/** Field messages from a failed shared-schema check or from the server's 400. */
export function fieldErrors(error: z.ZodError | unknown): Record<string, string> {
  if (error instanceof ApiError) return (error.details?.fields as Record<string, string> | undefined) ?? {};
  if (error && typeof error === 'object' && 'issues' in error) {
    return Object.fromEntries((error as z.ZodError).issues.map((i) => [String(i.path[0] ?? '_'), i.message]));
  }
  return {};
}
