import { z } from 'zod';

/** What the object store of uploaded files (location removed) holds: GET /api/admin/object-store. */
export const objectStoreSizeSchema = z.object({
  objects: z.number().int().nonnegative(),
  bytes: z.number().int().nonnegative(),
});
export type ObjectStoreSize = z.infer<typeof objectStoreSizeSchema>;
