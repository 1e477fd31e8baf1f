import "server-only";
/**
 * Chips and revisions: the services behind the upload flow, the operating
 * point form and the REST API. Callers have already authorised (they pass the
 * MemberContext from requireMembership/requireAccessTo); these functions check
 * the domain rules (duplicates, frozen revisions, valid layouts) and write
 * whole or nothing.
 */
import { getDb } from "@/db";
import * as q from "@/db/queries/chips";
import { recordAuditEvent } from "@/lib/audit";
import { analyzeLayout } from "@/lib/analysis/analyze";
import type { AnalyzeJson } from "@/lib/analysis/serialize";
import type { MemberContext } from "@/lib/auth/require";
import { ConflictError, DomainError, NotFoundError } from "@/lib/errors";
import { surveyLayout, type LayoutSurvey } from "@/lib/network/survey";
import { assertEditable, type ReviewStatus } from "@/lib/review/machine";
import { deleteFile, getFile, putFile, sha256Hex } from "@/lib/storage/files";
import { toConditions, type WorkspaceFluidChoice, type WorkspaceOverrides } from "./conditions";
import { listProcessOverrides, listThresholdOverrides } from "./settings";
import type { ChipCreateInput, LayerMapInput, OperatingPointForm } from "./schemas";

/** Bumped when the engine's output changes meaning, so stored analyses can be told apart. */
export const ENGINE_VERSION = 1;

export function maxUploadBytes(): number {
  const fromEnv = Number(process.env.MAX_UPLOAD_BYTES);
  return Number.isFinite(fromEnv) && fromEnv > 0 ? fromEnv : 25 * 1024 * 1024;
}

export async function createChip(ctx: MemberContext, input: ChipCreateInput) {
  if (await q.findChipByName(ctx.scope, input.name)) {
    throw new ConflictError("chip_exists", `A chip named “${input.name}” already exists in this workspace; choose another name or open that chip.`);
  }
  return getDb().transaction(async (tx) => {
    const chip = await q.insertChip(tx, ctx.scope, input);
    await recordAuditEvent(
      { workspaceId: ctx.workspace.id, actorUserId: ctx.user.id, action: "chip.created", objectType: "chip", objectId: chip.id, details: { name: chip.name } },
      tx,
    );
    return chip;
  });
}

export async function requireChip(ctx: MemberContext, chipId: number) {
  const chip = await q.getChip(ctx.scope, chipId);
  if (!chip) throw new NotFoundError("That chip does not exist in this workspace.");
  return chip;
}

export async function requireRevision(ctx: MemberContext, chipId: number, number: number) {
  const revision = await q.getRevision(ctx.scope, chipId, number);
  if (!revision) throw new NotFoundError(`Revision ${number} of this chip does not exist.`);
  return revision;
}

export type UploadInput = { fileName: string; bytes: Uint8Array; note: string };

/**
 * Checks an uploaded layout before anything is stored: a .dxf name, under the
 * size limit, readable as an ASCII DXF (the layer survey must succeed).
 * @throws DomainError 413 too large, 415 wrong type; LayoutError 422 unreadable.
 */
export function checkUpload(fileName: string, bytes: Uint8Array): LayoutSurvey {
  const limit = maxUploadBytes();
  if (bytes.byteLength > limit) {
    throw new DomainError(
      "file_too_large",
      `The file is ${(bytes.byteLength / 1048576).toFixed(1)} MiB; uploads are limited to ${(limit / 1048576).toFixed(0)} MiB. Purge unused blocks and layers and export again.`,
      413,
    );
  }
  if (!/\.dxf$/i.test(fileName)) {
    throw new DomainError("unsupported_file", `“${fileName}” is not a .dxf file. Export the layout as an ASCII DXF and upload that.`, 415);
  }
  return surveyLayout(bytes);
}

/**
 * Uploads a new revision of a chip. The same bytes as an existing revision are
 * refused with 409 duplicate_revision ("already revision N").
 */
export async function uploadRevision(ctx: MemberContext, chipId: number, input: UploadInput) {
  const chip = await requireChip(ctx, chipId);
  const survey = checkUpload(input.fileName, input.bytes);
  const sha256 = sha256Hex(input.bytes);
  const existing = await q.findRevisionBySha(ctx.scope, chip.id, sha256);
  if (existing) {
    throw new ConflictError("duplicate_revision", `This file is already revision ${existing.number} of ${chip.name}; nothing was uploaded.`, {
      revision: existing.number,
    });
  }
  const stored = await putFile(input.bytes);
  try {
    return await getDb().transaction(async (tx) => {
      const { number, parentId } = await q.nextRevisionNumber(tx, ctx.scope, chip.id);
      const revision = await q.insertRevision(tx, ctx.scope, {
        chipId: chip.id,
        number,
        parentRevisionId: parentId,
        fileName: input.fileName.slice(0, 255),
        sizeBytes: input.bytes.byteLength,
        sha256,
        storageKey: stored.key,
        note: input.note,
        layers: survey.layers,
      });
      await q.touchChip(tx, ctx.scope, chip.id);
      await recordAuditEvent(
        {
          workspaceId: ctx.workspace.id,
          actorUserId: ctx.user.id,
          action: "revision.uploaded",
          objectType: "revision",
          objectId: revision.id,
          details: { chipId: chip.id, number, fileName: revision.fileName, sha256, sizeBytes: revision.sizeBytes },
        },
        tx,
      );
      return { revision, survey };
    });
  } catch (err) {
    if (stored.created) await deleteFile(stored.key);
    throw err;
  }
}

/** The stored file of a revision, byte for byte. */
export async function readRevisionFile(storageKey: string): Promise<Buffer> {
  return getFile(storageKey);
}

/**
 * Saves how the revision's layers are read. Checked by reading the network
 * with it, so a mapping that cannot work is refused before it is stored.
 */
export async function saveLayerMap(ctx: MemberContext, chipId: number, number: number, mapping: LayerMapInput) {
  const revision = await requireRevision(ctx, chipId, number);
  assertEditable({ status: revision.reviewState as ReviewStatus });
  const bytes = await readRevisionFile(revision.storageKey);
  // Geometry only: throws LayoutError/ConditionsError in plain words if the mapping does not give a network.
  analyzeLayout(bytes, mapping);
  const written = await getDb().transaction(async (tx) => {
    const ok = await q.insertLayerMap(tx, ctx.scope, revision.id, mapping as Record<string, unknown>);
    if (ok) {
      await recordAuditEvent(
        { workspaceId: ctx.workspace.id, actorUserId: ctx.user.id, action: "revision.layers_mapped", objectType: "revision", objectId: revision.id, details: { mapping } },
        tx,
      );
    }
    return ok;
  });
  if (!written) throw new ConflictError("layer_map_exists", "This revision's layers are already mapped; upload a new revision to read the layout differently.");
  return revision;
}

/** Figures a list needs, from an analyze document. */
export function summarise(result: AnalyzeJson) {
  const count = (s: string) => result.flags.filter((f) => f.severity === s).length;
  const block = count("block");
  const warn = count("warn");
  const info = count("info");
  const b = result.bounds_m;
  return {
    segmentCount: result.segments.length,
    maxInletPressurePa: result.totals?.max_inlet_pressure_Pa ?? null,
    totalFlowM3PerS: result.totals?.total_flow_m3_per_s ?? null,
    meanResidenceS: result.totals?.mean_residence_s ?? null,
    maxReynolds: result.totals?.max_reynolds.value ?? null,
    footprintM2: Number.isFinite(b.max_x - b.min_x) ? (b.max_x - b.min_x) * (b.max_y - b.min_y) : null,
    flagsInfo: info,
    flagsWarn: warn,
    flagsBlock: block,
    worstSeverity: block ? "block" : warn ? "warn" : info ? "info" : "none",
  };
}

/** The workspace's threshold and process-limit overrides, in the shape toConditions takes. */
export async function loadWorkspaceOverrides(ctx: MemberContext): Promise<WorkspaceOverrides> {
  const [thresholds, processes] = await Promise.all([listThresholdOverrides(ctx.scope), listProcessOverrides(ctx.scope)]);
  return {
    thresholds: Object.fromEntries(Object.entries(thresholds).map(([code, o]) => [code, o.value])),
    processes: Object.fromEntries(Object.entries(processes).map(([key, o]) => [key, o.values])),
  };
}

/**
 * Creates an operating point on a revision and analyses it, with the
 * workspace's threshold and process-limit overrides in its conditions. The operating point
 * is kept even when the analysis fails; the failure is stored in plain words.
 * @throws ConflictError when the revision is cleared (frozen) or not mapped yet.
 */
export async function createOperatingPoint(
  ctx: MemberContext,
  chipId: number,
  number: number,
  form: OperatingPointForm,
  workspaceFluids: WorkspaceFluidChoice[] = [],
) {
  const revision = await requireRevision(ctx, chipId, number);
  assertEditable({ status: revision.reviewState as ReviewStatus });
  const mapping = await q.getLayerMap(ctx.scope, revision.id);
  if (!mapping) throw new ConflictError("not_mapped", "Map this revision's layers before adding an operating point.");
  const conditions = toConditions(mapping as LayerMapInput, form, workspaceFluids, await loadWorkspaceOverrides(ctx));
  const bytes = await readRevisionFile(revision.storageKey);
  let outcome: { status: "ok"; result: AnalyzeJson } | { status: "failed"; code: string; message: string };
  try {
    outcome = { status: "ok", result: analyzeLayout(bytes, conditions) };
  } catch (err) {
    if (!(err instanceof DomainError)) throw err;
    outcome = { status: "failed", code: err.code, message: err.message };
  }
  return getDb().transaction(async (tx) => {
    const operatingPointId = await q.insertOperatingPoint(tx, ctx.scope, {
      revisionId: revision.id,
      name: form.name,
      conditions: conditions as Record<string, unknown>,
      form: form as unknown as Record<string, unknown>,
    });
    const analysisId = await q.insertAnalysis(
      tx,
      ctx.scope,
      outcome.status === "ok"
        ? { revisionId: revision.id, operatingPointId, status: "ok", result: outcome.result as unknown as Record<string, unknown>, engineVersion: ENGINE_VERSION, ...summarise(outcome.result) }
        : { revisionId: revision.id, operatingPointId, status: "failed", errorCode: outcome.code, errorMessage: outcome.message, engineVersion: ENGINE_VERSION },
    );
    await q.touchChip(tx, ctx.scope, chipId);
    await recordAuditEvent(
      {
        workspaceId: ctx.workspace.id,
        actorUserId: ctx.user.id,
        action: outcome.status === "ok" ? "analysis.completed" : "analysis.failed",
        objectType: "revision",
        objectId: revision.id,
        details: { operatingPointId, analysisId, name: form.name, ...(outcome.status === "failed" ? { code: outcome.code } : {}) },
      },
      tx,
    );
    return { operatingPointId, analysisId, status: outcome.status, error: outcome.status === "failed" ? { code: outcome.code, message: outcome.message } : null };
  });
}


/** A chip's revisions with their analyses and whether their layers are mapped, newest first, for the history page. */
export async function listRevisionHistory(ctx: MemberContext, chipId: number) {
  const revisions = await q.listRevisions(ctx.scope, chipId);
  return Promise.all(
    revisions.map(async (r) => ({
      revision: r,
      mapped: (await q.getLayerMap(ctx.scope, r.id)) !== null,
      analyses: await q.listAnalyses(ctx.scope, r.id),
    })),
  );
}

/**
 * The port names of a mapped revision, for the operating point form: from its
 * latest successful analysis when there is one, else by reading the network
 * with the layer map (geometry only). Empty when the layout has no ports.
 */
export async function listRevisionPorts(ctx: MemberContext, revisionId: number, storageKey: string, mapping: LayerMapInput): Promise<string[]> {
  const latest = await q.getLatestAnalysisIdForRevision(ctx.scope, revisionId);
  if (latest !== null) {
    const a = await q.getAnalysis(ctx.scope, latest);
    const ports = (a?.result as AnalyzeJson | null)?.ports;
    if (ports && ports.length > 0) return ports.map((p) => p.name);
  }
  const result = analyzeLayout(await readRevisionFile(storageKey), mapping);
  return result.ports.map((p) => p.name);
}

/** What a failed analysis's error code asks the designer to change, in plain words (the message says what went wrong). */
export function adviceForFailure(code: string | null): string {
  switch (code) {
    case "unknown_fluid":
    case "unknown_process":
    case "invalid_quantity":
    case "invalid_conditions":
      return "Change the operating point: add a new one with the value corrected (this one stays on record as it was).";
    case "contradictory_ports":
    case "dangling_port":
    case "dangling_segment":
    case "singular_network":
      return "Drive at least one port of every connected part of the chip by pressure (an outlet at 0 mbar is usual), or check that the channels really connect to the ports.";
    default:
      return "Check the operating point's values and the layer mapping; add a new operating point with the values corrected, or upload a corrected layout as a new revision.";
  }
}
