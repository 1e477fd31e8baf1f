/**
 * Chips, revisions and everything analysed or reviewed on them. Same
 * conventions as db/schema.ts: integer ids, UTC millisecond timestamps, every
 * row carries workspace_id and is read through db/queries/ with a scope.
 * Revisions, their files and their analyses are immutable once written: the
 * only column of `revisions` that changes is the review state (with its
 * version counter for compare-and-set updates).
 */
import { index, integer, real, sqliteTable, text, uniqueIndex } from "drizzle-orm/sqlite-core";
import { users, workspaces } from "./schema";
import { timestampNow } from "./columns";

const createdAt = () => timestampNow("created_at");

const workspaceRef = () =>
  integer("workspace_id")
    .notNull()
    .references(() => workspaces.id, { onDelete: "cascade" });

export const chips = sqliteTable(
  "chips",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    workspaceId: workspaceRef(),
    name: text("name").notNull(),
    purpose: text("purpose").notNull().default(""),
    createdByUserId: integer("created_by_user_id").references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
    /** Last upload, analysis or review step on any revision: what the chip list sorts by. */
    lastActivityAt: timestampNow("last_activity_at"),
  },
  (t) => [uniqueIndex("chips_workspace_name").on(t.workspaceId, t.name)],
);
export type ChipRow = typeof chips.$inferSelect;

export const revisions = sqliteTable(
  "revisions",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    workspaceId: workspaceRef(),
    chipId: integer("chip_id")
      .notNull()
      .references(() => chips.id, { onDelete: "cascade" }),
    number: integer("number").notNull(),
    parentRevisionId: integer("parent_revision_id"),
    uploadedByUserId: integer("uploaded_by_user_id").references(() => users.id, { onDelete: "set null" }),
    uploadedAt: timestampNow("uploaded_at"),
    fileName: text("file_name").notNull(),
    sizeBytes: integer("size_bytes").notNull(),
    sha256: text("sha256").notNull(),
    /** Key of the intact file in lib/storage. */
    storageKey: text("storage_key").notNull(),
    note: text("note").notNull().default(""),
    /** Layers found in the file with entity counts and proposed roles (from the reader). */
    layers: text("layers", { mode: "json" }).$type<unknown[]>().notNull().default([]),
    /** Review state (lib/review/machine) and its version for compare-and-set. */
    reviewState: text("review_state").notNull().default("draft"),
    reviewVersion: integer("review_version").notNull().default(0),
    reviewStateSince: timestampNow("review_state_since"),
    /** The operating point's analysis submitted for review (set on submit). */
    reviewAnalysisId: integer("review_analysis_id"),
  },
  (t) => [
    uniqueIndex("revisions_chip_number").on(t.chipId, t.number),
    uniqueIndex("revisions_chip_sha").on(t.chipId, t.sha256),
    index("revisions_workspace_state").on(t.workspaceId, t.reviewState),
  ],
);
export type RevisionRow = typeof revisions.$inferSelect;

/** How a revision's layers are read (the geometry part of the conditions). One per revision, written at mapping. */
export const layerMaps = sqliteTable("layer_maps", {
  id: integer("id").primaryKey({ autoIncrement: true }),
  workspaceId: workspaceRef(),
  revisionId: integer("revision_id")
    .notNull()
    .unique()
    .references(() => revisions.id, { onDelete: "cascade" }),
  /** {units?, snap?, layers: {NAME: {role, depth?, width?, section?}}} */
  mapping: text("mapping", { mode: "json" }).$type<Record<string, unknown>>().notNull(),
  createdByUserId: integer("created_by_user_id").references(() => users.id, { onDelete: "set null" }),
  createdAt: createdAt(),
});
export type LayerMapRow = typeof layerMaps.$inferSelect;

/** A named set of driving conditions for a revision. Never edited: a change is a new row. */
export const operatingPoints = sqliteTable(
  "operating_points",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    workspaceId: workspaceRef(),
    revisionId: integer("revision_id")
      .notNull()
      .references(() => revisions.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    /** The full conditions document given to the engine (geometry part from the layer map included). */
    conditions: text("conditions", { mode: "json" }).$type<Record<string, unknown>>().notNull(),
    /** The form values as the user typed them, so the form can be reopened as a copy. */
    form: text("form", { mode: "json" }).$type<Record<string, unknown>>().notNull(),
    createdByUserId: integer("created_by_user_id").references(() => users.id, { onDelete: "set null" }),
    createdAt: createdAt(),
  },
  (t) => [index("operating_points_revision").on(t.revisionId)],
);
export type OperatingPointRow = typeof operatingPoints.$inferSelect;

export const analyses = sqliteTable(
  "analyses",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    workspaceId: workspaceRef(),
    revisionId: integer("revision_id")
      .notNull()
      .references(() => revisions.id, { onDelete: "cascade" }),
    operatingPointId: integer("operating_point_id")
      .notNull()
      .references(() => operatingPoints.id, { onDelete: "cascade" }),
    status: text("status", { enum: ["ok", "failed"] }).notNull(),
    /** The full analyze JSON (lib/analysis/serialize) when ok. */
    result: text("result", { mode: "json" }).$type<Record<string, unknown>>(),
    errorCode: text("error_code"),
    errorMessage: text("error_message"),
    engineVersion: integer("engine_version").notNull(),
    // Summary figures a list needs without parsing the result.
    segmentCount: integer("segment_count"),
    maxInletPressurePa: real("max_inlet_pressure_pa"),
    totalFlowM3PerS: real("total_flow_m3_per_s"),
    meanResidenceS: real("mean_residence_s"),
    maxReynolds: real("max_reynolds"),
    footprintM2: real("footprint_m2"),
    flagsInfo: integer("flags_info").notNull().default(0),
    flagsWarn: integer("flags_warn").notNull().default(0),
    flagsBlock: integer("flags_block").notNull().default(0),
    worstSeverity: text("worst_severity"),
    createdAt: createdAt(),
  },
  (t) => [index("analyses_revision").on(t.revisionId), index("analyses_operating_point").on(t.operatingPointId)],
);
export type AnalysisRow = typeof analyses.$inferSelect;

/** A fluid defined by the workspace, with the source of each value. */
export const workspaceFluids = sqliteTable(
  "workspace_fluids",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    workspaceId: workspaceRef(),
    key: text("key").notNull(),
    name: text("name").notNull(),
    /** {viscosity, density, surface_tension, diffusivity?} as quantities with units, plus {source} per value. */
    properties: text("properties", { mode: "json" }).$type<Record<string, unknown>>().notNull(),
    updatedByUserId: integer("updated_by_user_id").references(() => users.id, { onDelete: "set null" }),
    updatedAt: timestampNow("updated_at"),
  },
  (t) => [uniqueIndex("workspace_fluids_key").on(t.workspaceId, t.key)],
);
export type WorkspaceFluidRow = typeof workspaceFluids.$inferSelect;

/** A workspace's overrides of a built-in process profile's fab rules and limits. */
export const processOverrides = sqliteTable(
  "process_overrides",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    workspaceId: workspaceRef(),
    processKey: text("process_key").notNull(),
    values: text("values", { mode: "json" }).$type<Record<string, number>>().notNull(),
    note: text("note").notNull().default(""),
    updatedByUserId: integer("updated_by_user_id").references(() => users.id, { onDelete: "set null" }),
    updatedAt: timestampNow("updated_at"),
  },
  (t) => [uniqueIndex("process_overrides_key").on(t.workspaceId, t.processKey)],
);
export type ProcessOverrideRow = typeof processOverrides.$inferSelect;

/** A workspace's override of one flag rule's threshold. */
export const thresholdOverrides = sqliteTable(
  "threshold_overrides",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    workspaceId: workspaceRef(),
    ruleCode: text("rule_code").notNull(),
    value: real("value").notNull(),
    note: text("note").notNull().default(""),
    updatedByUserId: integer("updated_by_user_id").references(() => users.id, { onDelete: "set null" }),
    updatedAt: timestampNow("updated_at"),
  },
  (t) => [uniqueIndex("threshold_overrides_code").on(t.workspaceId, t.ruleCode)],
);
export type ThresholdOverrideRow = typeof thresholdOverrides.$inferSelect;

/** Personal API tokens: only a SHA-256 of the secret is kept; the secret is shown once. */
export const apiTokens = sqliteTable(
  "api_tokens",
  {
    id: integer("id").primaryKey({ autoIncrement: true }),
    workspaceId: workspaceRef(),
    userId: integer("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    /** First characters of the token, to tell tokens apart in the list. */
    prefix: text("prefix").notNull(),
    tokenHash: text("token_hash").notNull().unique(),
    createdAt: createdAt(),
    lastUsedAt: integer("last_used_at", { mode: "timestamp_ms" }),
    revokedAt: integer("revoked_at", { mode: "timestamp_ms" }),
  },
  (t) => [index("api_tokens_user").on(t.userId)],
);
export type ApiTokenRow = typeof apiTokens.$inferSelect;
