/**
 * Reports: read-only share links to one revision's brief. Same conventions as
 * db/schema.ts: integer ids, UTC millisecond timestamps, workspace_id on every
 * row, read through db/queries/reports.ts with a scope (the public link is
 * found by its token hash only). The token itself is never stored: only its
 * SHA-256, as with invitations and API tokens.
 */
import { index, integer, sqliteTable, text } from "drizzle-orm/sqlite-core";
import { users, workspaces } from "./schema";
import { revisions } from "./schema-chips";
import { timestampNow } from "./columns";

export const shareLinks = sqliteTable(
  "share_links",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    workspaceId: integer("workspace_id")
      .notNull()
      .references(() => workspaces.id, { onDelete: "cascade" }),
    revisionId: integer("revision_id")
      .notNull()
      .references(() => revisions.id, { onDelete: "cascade" }),
    /** SHA-256 (hex) of the token in the link. */
    tokenHash: text("token_hash").notNull().unique(),
    /** A few characters of the token, to tell links apart in the list. */
    prefix: text("prefix").notNull(),
    /** Who the link is for, in the creator's words ("Board pack, March"). */
    label: text("label").notNull().default(""),
    createdByUserId: integer("created_by_user_id").references(() => users.id, { onDelete: "set null" }),
    createdAt: timestampNow("created_at"),
    expiresAt: integer("expires_at", { mode: "timestamp_ms" }).notNull(),
    revokedAt: integer("revoked_at", { mode: "timestamp_ms" }),
    revokedByUserId: integer("revoked_by_user_id").references(() => users.id, { onDelete: "set null" }),
  },
  (t) => [index("share_links_revision").on(t.revisionId)],
);
export type ShareLinkRow = typeof shareLinks.$inferSelect;
