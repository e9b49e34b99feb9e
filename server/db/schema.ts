// Lamina's tables. Every row that belongs to a practice carries `practice_id`,
// and every query filters on it (see server/utils/tenancy in DEVELOPERS.md).
// Ids are nanoid strings: unguessable, so a 404 for another practice's row leaks nothing.
import { sql } from 'drizzle-orm'
import {
  boolean, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uniqueIndex,
} from 'drizzle-orm/pg-core'
import { nanoid } from 'nanoid'

const id = () => text('id').primaryKey().$defaultFn(() => nanoid())
const createdAt = () => timestamp('created_at', { withTimezone: true }).notNull().defaultNow()
const updatedAt = () => timestamp('updated_at', { withTimezone: true }).notNull().defaultNow().$onUpdate(() => new Date())
const practiceRef = () => text('practice_id').notNull().references(() => practices.id, { onDelete: 'cascade' })

export const roleEnum = pgEnum('member_role', ['owner', 'senior_coach', 'junior_coach', 'reviewer', 'client'])
export const guidelineEnum = pgEnum('bp_guideline', ['acc-aha-2017', 'esh-2023'])
export const versionStatusEnum = pgEnum('version_status', ['draft', 'in_review', 'approved', 'returned', 'retired'])

/** Key/value facts about this installation (e.g. that the demo practice was seeded). */
export const appMeta = pgTable('app_meta', {
  key: text('key').primaryKey(),
  value: jsonb('value').notNull(),
  updatedAt: updatedAt(),
})

export const practices = pgTable('practices', {
  id: id(),
  name: text('name').notNull(),
  slug: text('slug').notNull(),
  guideline: guidelineEnum('guideline').notNull().default('acc-aha-2017'),
  isDemo: boolean('is_demo').notNull().default(false),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
}, t => [uniqueIndex('practices_slug_key').on(t.slug)])

export const users = pgTable('users', {
  id: id(),
  email: text('email').notNull(),
  name: text('name').notNull(),
  passwordHash: text('password_hash'),
  /** Sessions carry this number; bumping it (password reset or change) ends every other session. */
  sessionVersion: integer('session_version').notNull().default(1),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
}, t => [uniqueIndex('users_email_key').on(sql`lower(${t.email})`)])

export const memberships = pgTable('memberships', {
  id: id(),
  practiceId: practiceRef(),
  userId: text('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  role: roleEnum('role').notNull(),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
}, t => [
  uniqueIndex('memberships_practice_user_key').on(t.practiceId, t.userId),
  index('memberships_user_idx').on(t.userId),
])

export const invitations = pgTable('invitations', {
  id: id(),
  practiceId: practiceRef(),
  email: text('email').notNull(),
  role: roleEnum('role').notNull(),
  tokenHash: text('token_hash').notNull(),
  invitedBy: text('invited_by').references(() => users.id, { onDelete: 'set null' }),
  expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
  acceptedAt: timestamp('accepted_at', { withTimezone: true }),
  revokedAt: timestamp('revoked_at', { withTimezone: true }),
  createdAt: createdAt(),
}, t => [
  uniqueIndex('invitations_token_key').on(t.tokenHash),
  index('invitations_practice_idx').on(t.practiceId),
  index('invitations_practice_email_idx').on(t.practiceId, sql`lower(${t.email})`),
])

export const passwordResets = pgTable('password_resets', {
  id: id(),
  userId: text('user_id').notNull().references(() => users.id, { onDelete: 'cascade' }),
  tokenHash: text('token_hash').notNull(),
  expiresAt: timestamp('expires_at', { withTimezone: true }).notNull(),
  usedAt: timestamp('used_at', { withTimezone: true }),
  createdAt: createdAt(),
}, t => [
  uniqueIndex('password_resets_token_key').on(t.tokenHash),
  index('password_resets_user_idx').on(t.userId),
])

/** Fixed-window counters for sign-in attempts, shared by every app instance. */
export const rateLimits = pgTable('rate_limits', {
  key: text('key').primaryKey(),
  count: integer('count').notNull().default(0),
  windowStartedAt: timestamp('window_started_at', { withTimezone: true }).notNull().defaultNow(),
})

/** Append-only: who did what, when, from where. */
export const auditEvents = pgTable('audit_events', {
  id: id(),
  practiceId: text('practice_id').references(() => practices.id, { onDelete: 'cascade' }),
  actorId: text('actor_id').references(() => users.id, { onDelete: 'set null' }),
  action: text('action').notNull(),
  subjectType: text('subject_type'),
  subjectId: text('subject_id'),
  detail: jsonb('detail').notNull().default({}),
  ip: text('ip'),
  userAgent: text('user_agent'),
  createdAt: createdAt(),
}, t => [index('audit_events_practice_time_idx').on(t.practiceId, t.createdAt)])

/** A practice's own blocks, same schema as the files in blocks/library. */
export const practiceBlocks = pgTable('practice_blocks', {
  id: id(),
  practiceId: practiceRef(),
  slug: text('slug').notNull(),
  definition: jsonb('definition').notNull(),
  createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
}, t => [uniqueIndex('practice_blocks_slug_key').on(t.practiceId, t.slug)])

/** A protocol template: the named thing a practice designs, versions and approves. */
export const templates = pgTable('templates', {
  id: id(),
  practiceId: practiceRef(),
  ownerId: text('owner_id').notNull().references(() => users.id, { onDelete: 'restrict' }),
  name: text('name').notNull(),
  tags: text('tags').array().notNull().default(sql`'{}'::text[]`),
  /** The approved version this template was cloned from (lineage). */
  clonedFromVersionId: text('cloned_from_version_id'),
  archivedAt: timestamp('archived_at', { withTimezone: true }),
  createdAt: createdAt(),
  updatedAt: updatedAt(),
}, t => [
  index('templates_practice_idx').on(t.practiceId, t.updatedAt),
  index('templates_owner_idx').on(t.practiceId, t.ownerId),
])

/** The one editable working copy of a template; `revision` guards against lost updates. */
export const templateDrafts = pgTable('template_drafts', {
  templateId: text('template_id').primaryKey().references(() => templates.id, { onDelete: 'cascade' }),
  practiceId: practiceRef(),
  document: jsonb('document').notNull(),
  revision: integer('revision').notNull().default(1),
  updatedBy: text('updated_by').references(() => users.id, { onDelete: 'set null' }),
  updatedAt: updatedAt(),
})

/** Immutable snapshots of a draft; only `status` and its decision fields change. */
export const templateVersions = pgTable('template_versions', {
  id: id(),
  practiceId: practiceRef(),
  templateId: text('template_id').notNull().references(() => templates.id, { onDelete: 'cascade' }),
  number: integer('number').notNull(),
  document: jsonb('document').notNull(),
  summary: jsonb('summary').notNull(),
  status: versionStatusEnum('status').notNull().default('draft'),
  parentVersionId: text('parent_version_id'),
  createdBy: text('created_by').references(() => users.id, { onDelete: 'set null' }),
  createdAt: createdAt(),
  submittedAt: timestamp('submitted_at', { withTimezone: true }),
  decidedAt: timestamp('decided_at', { withTimezone: true }),
  decidedBy: text('decided_by').references(() => users.id, { onDelete: 'set null' }),
}, t => [
  uniqueIndex('template_versions_number_key').on(t.templateId, t.number),
  index('template_versions_status_idx').on(t.practiceId, t.status),
])

export type Practice = typeof practices.$inferSelect
export type User = typeof users.$inferSelect
export type Membership = typeof memberships.$inferSelect
export type Role = (typeof roleEnum.enumValues)[number]
export type Invitation = typeof invitations.$inferSelect
export type AuditEvent = typeof auditEvents.$inferSelect
export type Template = typeof templates.$inferSelect
export type TemplateDraft = typeof templateDrafts.$inferSelect
export type TemplateVersion = typeof templateVersions.$inferSelect
