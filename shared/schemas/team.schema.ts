import { z } from 'zod';
import { isoDateTimeSchema, roleSchema, uuidSchema } from './common.schema.ts';

export const membershipSchema = z.object({
  organisationId: uuidSchema,
  organisationName: z.string(),
  role: roleSchema,
});

export const meSchema = z.object({
  id: uuidSchema,
  email: z.string(),
  displayName: z.string(),
  memberships: z.array(membershipSchema),
});
export type Me = z.infer<typeof meSchema>;

export const organisationInputSchema = z.object({
  name: z.string().trim().min(2, 'name must be at least 2 characters').max(120, 'name must be at most 120 characters'),
});

export const organisationSchema = z.object({ id: uuidSchema, name: z.string(), createdAt: isoDateTimeSchema, role: roleSchema });

export const memberSchema = z.object({
  userId: uuidSchema,
  email: z.string(),
  displayName: z.string(),
  role: roleSchema,
  joinedAt: isoDateTimeSchema,
});
export const memberListSchema = z.object({ members: z.array(memberSchema) });

export const roleChangeSchema = z.object({ role: roleSchema });

export const invitationInputSchema = z.object({
  email: z.email({ error: 'must be an e-mail address' }).max(254),
  role: roleSchema,
});

export const invitationSchema = z.object({
  id: uuidSchema,
  email: z.string(),
  role: roleSchema,
  status: z.enum(['pending', 'accepted', 'expired', 'revoked']),
  createdAt: isoDateTimeSchema,
  expiresAt: isoDateTimeSchema,
});
export const invitationListSchema = z.object({ invitations: z.array(invitationSchema) });

export const invitationPreviewSchema = z.object({ organisationName: z.string(), role: roleSchema, email: z.string(), expiresAt: isoDateTimeSchema });

export const auditEventSchema = z.object({
  id: z.number(),
  action: z.string(),
  subject: z.string(),
  actor: z.string().nullable(),
  details: z.record(z.string(), z.unknown()),
  createdAt: isoDateTimeSchema,
});
export const auditListSchema = z.object({ events: z.array(auditEventSchema) });
