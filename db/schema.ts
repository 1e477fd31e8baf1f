/**
 * Stokeline's store (Drizzle, SQLite/libSQL). Conventions: integer primary keys,
 * every timestamp an integer of UTC milliseconds since the epoch (mode
 * "timestamp_ms" → Date in code), tables plural snake_case with their inferred
 * row types beside them. Every workspace-owned table carries workspace_id and is
 * read only through db/queries/, which filters by it.
 */
import { sql } from "drizzle-orm";
import { check, index, integer, primaryKey, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { ROLES } from "@/lib/auth/roles";
import { timestampNow } from "./columns";

const createdAt = () => timestampNow("created_at");

const roleList = ROLES.map((r) => `'${r}'`).join(", ");

export const users = sqliteTable("users", {
  id: integer("id").primaryKey({ autoIncrement: true }),
  email: text("email").notNull().unique(),
  name: text("name").notNull(),
  passwordHash: text("password_hash").notNull(),
  /** Display-unit preferences, e.g. {"pressure":"mbar","length":"um"}; read by later settings pages. */
  unitPreferences: text("unit_preferences", { mode: "json" }).$type<Record<string, string>>().notNull().default({}),
  createdAt: createdAt(),
});
export type UserRow = typeof users.$inferSelect;

export const workspaces = sqliteTable("workspaces", {
  id: integer("id").primaryKey({ autoIncrement: true }),
  slug: text("slug").notNull().unique(),
  name: text("name").notNull(),
  createdAt: createdAt(),
});
export type WorkspaceRow = typeof workspaces.$inferSelect;

export const memberships = sqliteTable(
  "memberships",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    workspaceId: integer("workspace_id")
      .notNull()
      .references(() => workspaces.id, { onDelete: "cascade" }),
    userId: integer("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("memberships_workspace_user").on(t.workspaceId, t.userId), index("memberships_user").on(t.userId)],
);
export type MembershipRow = typeof memberships.$inferSelect;

/**
 * One row per role a member holds. A table rather than a JSON array so the
 * database itself refuses unknown roles (CHECK) and duplicates (primary key),
 * and "every fluidics reviewer of workspace W" is a plain indexed query.
 */
export const membershipRoles = sqliteTable(
  "membership_roles",
  {
    membershipId: integer("membership_id")
      .notNull()
      .references(() => memberships.id, { onDelete: "cascade" }),
    role: text("role", { enum: ROLES }).notNull(),
  },
  (t) => [primaryKey({ columns: [t.membershipId, t.role] }), check("membership_roles_role_known", sql.raw(`"role" in (${roleList})`))],
);
export type MembershipRoleRow = typeof membershipRoles.$inferSelect;

export const invitations = sqliteTable(
  "invitations",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    workspaceId: integer("workspace_id")
      .notNull()
      .references(() => workspaces.id, { onDelete: "cascade" }),
    email: text("email").notNull(),
    roles: text("roles", { mode: "json" }).$type<string[]>().notNull(),
    /** SHA-256 (hex) of the token in the e-mailed link; the token itself is never stored. */
    tokenHash: text("token_hash").notNull().unique(),
    invitedByUserId: integer("invited_by_user_id").references(() => users.id, { onDelete: "set null" }),
    expiresAt: integer("expires_at", { mode: "timestamp_ms" }).notNull(),
    acceptedAt: integer("accepted_at", { mode: "timestamp_ms" }),
    revokedAt: integer("revoked_at", { mode: "timestamp_ms" }),
    createdAt: createdAt(),
  },
  (t) => [index("invitations_workspace").on(t.workspaceId)],
);
export type InvitationRow = typeof invitations.$inferSelect;

export const passwordResetTokens = sqliteTable(
  "password_reset_tokens",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    userId: integer("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    tokenHash: text("token_hash").notNull().unique(),
    expiresAt: integer("expires_at", { mode: "timestamp_ms" }).notNull(),
    usedAt: integer("used_at", { mode: "timestamp_ms" }),
    createdAt: createdAt(),
  },
  (t) => [index("password_reset_tokens_user").on(t.userId)],
);
export type PasswordResetTokenRow = typeof passwordResetTokens.$inferSelect;

/** Append-only: a migration adds triggers that abort any UPDATE or DELETE. */
export const auditEvents = sqliteTable(
  "audit_events",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    workspaceId: integer("workspace_id").references(() => workspaces.id),
    actorUserId: integer("actor_user_id").references(() => users.id),
    action: text("action").notNull(),
    objectType: text("object_type").notNull(),
    objectId: text("object_id").notNull(),
    at: timestampNow("at"),
    details: text("details", { mode: "json" }).$type<Record<string, unknown>>().notNull().default({}),
  },
  (t) => [index("audit_events_workspace_at").on(t.workspaceId, t.at), index("audit_events_object").on(t.objectType, t.objectId)],
);
export type AuditEventRow = typeof auditEvents.$inferSelect;

/** The local mail transport's store (used when SMTP_URL is unset). */
export const mailOutbox = sqliteTable(
  "mail_outbox",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    /** The workspace the message was sent for, when there is one (invitations); null for account mail. */
    workspaceId: integer("workspace_id").references(() => workspaces.id, { onDelete: "set null" }),
    fromAddress: text("from_address").notNull(),
    toAddress: text("to_address").notNull(),
    subject: text("subject").notNull(),
    text: text("text").notNull(),
    html: text("html"),
    messageId: text("message_id"),
    createdAt: createdAt(),
  },
  (t) => [index("mail_outbox_to").on(t.toAddress), index("mail_outbox_workspace").on(t.workspaceId)],
);
export type MailOutboxRow = typeof mailOutbox.$inferSelect;

export const signInAttempts = sqliteTable(
  "sign_in_attempts",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    email: text("email").notNull(),
    clientAddress: text("client_address").notNull(),
    succeeded: integer("succeeded", { mode: "boolean" }).notNull(),
    at: timestampNow("at"),
  },
  (t) => [index("sign_in_attempts_email_at").on(t.email, t.at), index("sign_in_attempts_address_at").on(t.clientAddress, t.at)],
);
export type SignInAttemptRow = typeof signInAttempts.$inferSelect;

// Chips, revisions, analyses and workspace settings (issue: chips and revisions).
export * from "./schema-chips";

// Review and sign-off: dispositions, comments, clearances, notifications (issue 7).
export * from "./schema-review";

// Reports: share links to a revision's brief (issue 8).
export * from "./schema-reports";
