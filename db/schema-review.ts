/**
 * Review and sign-off: flag dispositions, threaded comments, clearances, the
 * in-app inbox and per-member notification preferences. Same conventions as
 * db/schema.ts: integer ids, UTC millisecond timestamps, workspace_id on every
 * row, read through db/queries/review.ts with a scope.
 *
 * Dispositions and clearances are records of decisions: never updated or
 * deleted (the migration adds triggers that refuse both). A reviewer who
 * changes their mind adds a newer disposition; the latest per flag counts.
 */
import { sql } from "drizzle-orm";
import { check, index, integer, primaryKey, real, sqliteTable, text } from "drizzle-orm/sqlite-core";
import { users, workspaces } from "./schema";
import { analyses, revisions } from "./schema-chips";
import { NOTIFICATION_KINDS } from "@/lib/notifications/kinds";
import { timestampNow } from "./columns";

const at = timestampNow;

const workspaceRef = () =>
  integer("workspace_id")
    .notNull()
    .references(() => workspaces.id, { onDelete: "cascade" });

const revisionRef = () =>
  integer("revision_id")
    .notNull()
    .references(() => revisions.id, { onDelete: "cascade" });

export const FLAG_DECISIONS = ["waived", "must_fix"] as const;

export const flagDispositions = sqliteTable(
  "flag_dispositions",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    workspaceId: workspaceRef(),
    revisionId: revisionRef(),
    analysisId: integer("analysis_id")
      .notNull()
      .references(() => analyses.id),
    /** lib/review/machine flagKey: rule code | target kind | target id. */
    flagKey: text("flag_key").notNull(),
    decision: text("decision", { enum: FLAG_DECISIONS }).notNull(),
    justification: text("justification"),
    /** The flag's value when decided (a waiver stops counting when a re-analysis moves it). */
    value: real("value"),
    byUserId: integer("by_user_id")
      .notNull()
      .references(() => users.id),
    at: at("at"),
  },
  (t) => [
    index("flag_dispositions_revision").on(t.revisionId, t.flagKey),
    check("flag_dispositions_decision_known", sql`"decision" in ('waived', 'must_fix')`),
    check("flag_dispositions_waiver_justified", sql`"decision" <> 'waived' or length(trim(coalesce("justification", ''))) > 0`),
  ],
);
export type FlagDispositionRow = typeof flagDispositions.$inferSelect;

export const reviewComments = sqliteTable(
  "review_comments",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    workspaceId: workspaceRef(),
    revisionId: revisionRef(),
    /** The comment this one answers; null for a thread's first comment. */
    parentId: integer("parent_id"),
    authorUserId: integer("author_user_id")
      .notNull()
      .references(() => users.id),
    body: text("body").notNull(),
    /** Pin to a segment of the network (segment id from the analysis)… */
    segmentId: text("segment_id"),
    /** …or to a point of the drawing, in metres. */
    xM: real("x_m"),
    yM: real("y_m"),
    /** User ids mentioned with @. */
    mentions: text("mentions", { mode: "json" }).$type<number[]>().notNull().default([]),
    createdAt: at("created_at"),
    resolvedAt: integer("resolved_at", { mode: "timestamp_ms" }),
    resolvedByUserId: integer("resolved_by_user_id").references(() => users.id),
  },
  (t) => [index("review_comments_revision").on(t.revisionId, t.createdAt)],
);
export type ReviewCommentRow = typeof reviewComments.$inferSelect;

/** The signature that cleared a revision for tape-out. One per revision; immutable. */
export const clearances = sqliteTable("clearances", {
  id: integer("id").primaryKey({ autoIncrement: true }),
  workspaceId: workspaceRef(),
  revisionId: integer("revision_id")
    .notNull()
    .unique()
    .references(() => revisions.id),
  byUserId: integer("by_user_id")
    .notNull()
    .references(() => users.id),
  at: at("at"),
  fabName: text("fab_name").notNull(),
  process: text("process").notNull(),
  /** SHA-256 of the revision's file at clearance. */
  fileSha256: text("file_sha256").notNull(),
  analysisId: integer("analysis_id")
    .notNull()
    .references(() => analyses.id),
});
export type ClearanceRow = typeof clearances.$inferSelect;

/** A member's in-app inbox. Always written; e-mail follows the preferences. */
export const notifications = sqliteTable(
  "notifications",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    workspaceId: workspaceRef(),
    userId: integer("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    kind: text("kind", { enum: NOTIFICATION_KINDS }).notNull(),
    revisionId: integer("revision_id").references(() => revisions.id, { onDelete: "cascade" }),
    /** Who caused it (null for the system). */
    actorUserId: integer("actor_user_id").references(() => users.id, { onDelete: "set null" }),
    /** One line for the inbox, written when the event happened. */
    summary: text("summary").notNull(),
    details: text("details", { mode: "json" }).$type<Record<string, unknown>>().notNull().default({}),
    createdAt: at("created_at"),
    readAt: integer("read_at", { mode: "timestamp_ms" }),
  },
  (t) => [
    index("notifications_user").on(t.userId, t.workspaceId, t.createdAt),
    check("notifications_kind_known", sql`"kind" in ('review_requested', 'changes_requested', 'cleared', 'mentioned')`),
  ],
);
export type NotificationRow = typeof notifications.$inferSelect;

/** Per member per kind: e-mail on or off (in-app is always on). No row = e-mail on. */
export const notificationPreferences = sqliteTable(
  "notification_preferences",
  {
    workspaceId: workspaceRef(),
    userId: integer("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    kind: text("kind", { enum: NOTIFICATION_KINDS }).notNull(),
    email: integer("email", { mode: "boolean" }).notNull(),
    updatedAt: at("updated_at"),
  },
  (t) => [primaryKey({ columns: [t.workspaceId, t.userId, t.kind] })],
);
export type NotificationPreferenceRow = typeof notificationPreferences.$inferSelect;
