import { z } from 'zod';
import { emailSchema } from './user';
import { versionSchema } from './designs-api';

export const reviewStates = ['pending', 'approved', 'changes_requested'] as const;
export const reviewStateSchema = z.enum(reviewStates);
export type ReviewState = z.infer<typeof reviewStateSchema>;

const personSchema = z.object({ id: z.string().uuid(), displayName: z.string(), email: z.string() });

export const shareVersionSchema = z
  .object({
    reviewerEmail: emailSchema,
    note: z.string({ error: 'Note must be text' }).trim().max(4000, 'Note must be at most 4000 characters').default(''),
  })
  .strict()
  .meta({ id: 'ShareVersion' });
export type ShareVersion = z.input<typeof shareVersionSchema>;

export const reviewSchema = z
  .object({
    id: z.string().uuid(),
    design: z.object({ id: z.string().uuid(), name: z.string() }),
    versionNumber: z.number().int(),
    requestedBy: personSchema,
    reviewerEmail: z.string(),
    reviewer: personSchema.nullable().describe('Null until an invited reviewer has signed up'),
    note: z.string(),
    state: reviewStateSchema,
    decisionNote: z.string().nullable(),
    decidedAt: z.string().nullable(),
    createdAt: z.string(),
    notification: z.enum(['pending', 'sent']).describe('Whether the e-mail to the reviewer has gone out'),
  })
  .meta({ id: 'Review' });
export type Review = z.infer<typeof reviewSchema>;

export const commentSchema = z
  .object({
    id: z.string().uuid(),
    reviewId: z.string().uuid(),
    author: personSchema,
    parentId: z.string().uuid().nullable(),
    stage: z.string().nullable().describe('Stage id the comment is anchored to, or null for the design as a whole'),
    field: z.string().nullable().describe('Field inside that stage, or null'),
    body: z.string(),
    resolved: z.boolean(),
    createdAt: z.string(),
  })
  .meta({ id: 'ReviewComment' });
export type ReviewComment = z.infer<typeof commentSchema>;

export const reviewDetailSchema = z
  .object({
    review: reviewSchema,
    version: versionSchema,
    comments: z.array(commentSchema),
    previousReviewedVersion: z.number().int().nullable().describe('The latest earlier version of this design that had a review, for comparison'),
  })
  .meta({ id: 'ReviewDetail' });
export type ReviewDetail = z.infer<typeof reviewDetailSchema>;

const optionalAnchor = (label: string) =>
  z.string({ error: `${label} must be text` }).trim().min(1, `${label} must not be empty`).max(200, `${label} must be at most 200 characters`).optional();

export const createCommentSchema = z
  .object({
    body: z.string({ error: (issue) => (issue.input === undefined ? 'Comment is required' : 'Comment must be text') }).trim().min(1, 'Comment is required').max(10000, 'Comment must be at most 10000 characters'),
    stage: optionalAnchor('Stage'),
    field: optionalAnchor('Field'),
    parentId: z.string().uuid('Parent must be the id of a comment').optional(),
  })
  .strict()
  .refine((value) => value.field === undefined || value.stage !== undefined, { message: 'A field needs its stage', path: ['stage'] })
  .meta({ id: 'CreateComment' });
export type CreateComment = z.input<typeof createCommentSchema>;

export const updateCommentSchema = z.object({ resolved: z.boolean({ error: 'Resolved must be true or false' }) }).strict().meta({ id: 'UpdateComment' });

export const decisionSchema = z
  .object({
    decision: z.enum(['approved', 'changes_requested'], { error: 'Decision must be approved or changes_requested' }),
    note: z.string({ error: 'Note must be text' }).trim().max(4000, 'Note must be at most 4000 characters').default(''),
  })
  .strict()
  .meta({ id: 'Decision' });
export type Decision = z.input<typeof decisionSchema>;

export const invitationSchema = z
  .object({ email: z.string(), expiresAt: z.string(), invitedBy: z.string().describe('Display name of who invited') })
  .meta({ id: 'Invitation' });

export const acceptInvitationSchema = z
  .object({
    displayName: z.string({ error: (issue) => (issue.input === undefined ? 'Display name is required' : 'Display name must be text') }).trim().min(1, 'Display name is required').max(100, 'Display name must be at most 100 characters'),
    password: z.string({ error: (issue) => (issue.input === undefined ? 'Password is required' : 'Password must be text') }).min(10, 'Password must be at least 10 characters').max(200, 'Password must be at most 200 characters'),
  })
  .strict()
  .meta({ id: 'AcceptInvitation' });

export const auditEventSchema = z
  .object({
    id: z.string(),
    versionNumber: z.number().int().nullable(),
    actor: personSchema.nullable(),
    action: z.enum(['created', 'saved', 'renamed', 'archived', 'restored', 'shared', 'commented', 'decided', 'invited']),
    detail: z.record(z.string(), z.unknown()),
    createdAt: z.string(),
  })
  .meta({ id: 'AuditEvent' });
export type AuditEvent = z.infer<typeof auditEventSchema>;

export const mailboxMessageSchema = z
  .object({
    id: z.string().uuid(),
    from: z.string(),
    to: z.array(z.string()),
    subject: z.string(),
    text: z.string(),
    html: z.string(),
    receivedAt: z.string(),
  })
  .meta({ id: 'MailboxMessage' });
export type MailboxMessage = z.infer<typeof mailboxMessageSchema>;
