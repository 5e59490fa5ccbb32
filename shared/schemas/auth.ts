import { z } from 'zod';
import { boundedWholeNumber, idNumber, singleLineText } from './fields';
import { GRANTABLE_ROLES, ROLES } from '../roles';

// Handles follow the provider's rules: letters, digits and single hyphens, not at
// either end, at most 39 characters.
export const handleSchema = z
  .string()
  .trim()
  .toLowerCase()
  .regex(/^[a-z0-9](?:[a-z0-9]|-(?=[a-z0-9])){0,38}$/, 'use 1–39 letters, digits or single hyphens');

// People's names are shown as text, never as HTML; control characters are dropped.
export const personNameSchema = z
  .string()
  .transform((s) => s.replace(/[\u0000-\u001f\u007f]/g, '').trim())
  .pipe(z.string().min(1, 'enter a name').max(80, 'keep it under 80 characters'));

/** A name someone types (account settings, the local provider's form): control characters are refused. */
export const personNameInput = singleLineText().trim().min(1, 'enter a name').max(80, 'keep it under 80 characters');

export const makerSummarySchema = z.object({ id: z.number(), slug: z.string(), name: z.string() });
export type MakerSummary = z.infer<typeof makerSummarySchema>;

export const notificationPrefsSchema = z.object({
  emailOnDecision: z.boolean(),
  emailOnReply: z.boolean(),
});
export type NotificationPrefs = z.infer<typeof notificationPrefsSchema>;

export const currentUserSchema = z.object({
  id: z.number(),
  handle: z.string(),
  name: z.string(),
  email: z.string().nullable(),
  avatarUrl: z.string().nullable(),
  roles: z.array(z.enum(ROLES)),
  makerIds: z.array(z.number()),
  makers: z.array(makerSummarySchema),
  notificationPrefs: notificationPrefsSchema,
});
export type CurrentUser = z.infer<typeof currentUserSchema>;

export const csrfTokenResponseSchema = z.object({ token: z.string() });

export const signInQuerySchema = z.object({
  // Only honoured when the app talks to the local fake provider.
  login: handleSchema.optional(),
  // A path inside Crosswatt to come back to; never another site.
  returnTo: z
    .string()
    .regex(/^\/(?![/\\])[^\s]*$/, 'must be a path on this site')
    .max(500)
    .optional(),
});

export const updateAccountInput = z
  .object({
    name: personNameInput.optional(),
    notificationPrefs: notificationPrefsSchema.partial().optional(),
  })
  .strict();
export type UpdateAccountInput = z.infer<typeof updateAccountInput>;

export const deleteAccountInput = z.object({
  confirmHandle: z.string().trim().toLowerCase().min(1, 'type your handle to confirm'),
});
export type DeleteAccountInput = z.infer<typeof deleteAccountInput>;

// Admin
export const adminUserListQuery = z.object({
  q: z.string().trim().max(80).optional(),
  role: z.enum(ROLES).optional(),
  page: boundedWholeNumber(1, 10_000).default(1),
});
export type AdminUserListQuery = z.infer<typeof adminUserListQuery>;

export const adminUserSchema = z.object({
  id: z.number(),
  handle: z.string(),
  name: z.string(),
  email: z.string().nullable(),
  roles: z.array(z.enum(ROLES)),
  maker: makerSummarySchema.nullable(),
  createdAt: z.string(),
  deleted: z.boolean(),
});
export type AdminUser = z.infer<typeof adminUserSchema>;

// Lists that come a page at a time.
const pageFields = { page: z.number(), pageSize: z.number(), total: z.number() };

export const adminUserListSchema = z.object({ users: z.array(adminUserSchema), ...pageFields });
export type AdminUserList = z.infer<typeof adminUserListSchema>;

export const userIdParams = z.object({ userId: idNumber() });
export const roleParams = userIdParams.extend({ role: z.enum(GRANTABLE_ROLES) });

export const grantRoleInput = z.object({
  role: z.enum(GRANTABLE_ROLES),
  reason: singleLineText().trim().max(500).optional(),
});
export type GrantRoleInput = z.infer<typeof grantRoleInput>;

export const verifyMakerStaffInput = z.object({
  makerId: z.number().int().positive(),
  reason: singleLineText().trim().max(500).optional(),
});
export type VerifyMakerStaffInput = z.infer<typeof verifyMakerStaffInput>;

export const auditLogQuery = z.object({
  subjectType: z.string().trim().max(40).optional(),
  action: z.string().trim().max(60).optional(),
  page: boundedWholeNumber(1, 10_000).default(1),
});
export type AuditLogQuery = z.infer<typeof auditLogQuery>;

export const auditEntrySchema = z.object({
  id: z.number(),
  actor: z.object({ id: z.number(), handle: z.string(), name: z.string() }).nullable(),
  action: z.string(),
  subjectType: z.string(),
  subjectId: z.string(),
  reason: z.string().nullable(),
  before: z.unknown().nullable(),
  after: z.unknown().nullable(),
  createdAt: z.string(),
});
export type AuditEntry = z.infer<typeof auditEntrySchema>;

export const auditLogSchema = z.object({ entries: z.array(auditEntrySchema), ...pageFields });
export type AuditLog = z.infer<typeof auditLogSchema>;

// The local fake provider's "create an identity" form.
export const fakeIdentityInput = z.object({
  login: handleSchema,
  name: personNameInput,
  email: z.email('enter an e-mail address').max(200),
});
