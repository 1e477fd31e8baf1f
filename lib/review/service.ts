import "server-only";
/**
 * The review path, persisted. Loads a revision's ReviewState from the database
 * (revision row + dispositions + clearance), asks the pure machine
 * (lib/review/machine) for the step, then in ONE transaction writes the new
 * state with a compare-and-set on review_version, the disposition or
 * clearance, the audit event and the inbox rows. E-mails go out after commit.
 * Callers have authorised the member for the workspace and the step's role
 * (route handlers and actions); the machine enforces four-eyes, uploader-only
 * and state rules.
 */
import { getDb } from "@/db";
import * as chipsQ from "@/db/queries/chips";
import { listAuditEvents, type AuditView } from "@/db/queries/audit";
import type { MemberView } from "@/db/queries/members";
import * as q from "@/db/queries/review";
import { recordAuditEvent } from "@/lib/audit";
import type { MemberContext } from "@/lib/auth/require";
import { verifyPassword } from "@/lib/auth/password";
import { formatCsv } from "@/lib/analysis/csv";
import type { AnalyzeJson } from "@/lib/analysis/serialize";
import { ConflictError, DomainError, NotFoundError, RateLimitedError } from "@/lib/errors";
import { deliverEmails, listWorkspaceMembers, planNotifications, type PlannedNotification, type RevisionFacts } from "@/lib/notifications/service";
import { getFile, sha256Hex } from "@/lib/storage/files";
import { SignatureError, StaleVersionError } from "./errors";
import {
  allowedEvents,
  reviewChecklist,
  STATUS_LABELS,
  toReviewAnalysis,
  transition,
  type FlagChecklistItem,
  type FlagDecision,
  type ReviewAnalysis,
  type ReviewEvent,
  type ReviewEventType,
  type ReviewState,
  type ReviewStatus,
} from "./machine";
import { planComment } from "./mentions";

/** Failed clearance signatures allowed per member in the window before the next is refused. Common practice (cf. sign-in throttling). */
export const MAX_SIGNATURE_FAILURES = 5;
export const SIGNATURE_WINDOW_MS = 15 * 60 * 1000;

type RevisionRow = NonNullable<Awaited<ReturnType<typeof chipsQ.getRevisionById>>>;

export type LoadedReview = {
  revision: RevisionRow;
  chip: { id: number; name: string };
  state: ReviewState;
  /** The analysis under review (null in a fresh draft). */
  analysis: ReviewAnalysis | null;
  analysisDoc: AnalyzeJson | null;
  dispositionHistory: Awaited<ReturnType<typeof q.listDispositionHistory>>;
  clearance: Awaited<ReturnType<typeof q.getClearance>>;
};

const memberIdOf = (userId: number | null): string => (userId === null ? "" : String(userId));

async function loadAnalysis(ctx: MemberContext, revisionId: number, analysisId: number): Promise<{ analysis: ReviewAnalysis; doc: AnalyzeJson } | null> {
  const row = await chipsQ.getAnalysis(ctx.scope, analysisId);
  if (!row || row.revisionId !== revisionId || row.status !== "ok" || !row.result) return null;
  const doc = row.result as unknown as AnalyzeJson;
  return { analysis: toReviewAnalysis(String(row.id), doc), doc };
}

/**
 * The review record of one revision as the machine sees it, with what the
 * pages show beside it.
 * @throws NotFoundError when the revision is not in the member's workspace.
 */
export async function loadReview(ctx: MemberContext, revisionId: number): Promise<LoadedReview> {
  const revision = await chipsQ.getRevisionById(ctx.scope, revisionId);
  if (!revision) throw new NotFoundError("That revision does not exist in this workspace.");
  const chip = await chipsQ.getChip(ctx.scope, revision.chipId);
  if (!chip) throw new NotFoundError("That revision's chip does not exist in this workspace.");
  const [dispositionHistory, clearance] = await Promise.all([q.listDispositionHistory(ctx.scope, revision.id), q.getClearance(ctx.scope, revision.id)]);
  const latest = new Map<string, (typeof dispositionHistory)[number]>();
  for (const d of dispositionHistory) latest.set(d.flagKey, d);
  const state: ReviewState = {
    status: revision.reviewState as ReviewStatus,
    version: revision.reviewVersion,
    uploadedByMemberId: memberIdOf(revision.uploadedByUserId),
    analysisId: revision.reviewAnalysisId === null ? null : String(revision.reviewAnalysisId),
    dispositions: [...latest.values()].map((d) => ({
      flagKey: d.flagKey,
      decision: d.decision,
      justification: d.justification,
      value: d.value,
      analysisId: String(d.analysisId),
      byMemberId: String(d.byUserId),
      atIso: d.at.toISOString(),
    })),
    clearance: clearance
      ? {
          byMemberId: String(clearance.byUserId),
          atIso: clearance.at.toISOString(),
          fileSha256: clearance.fileSha256,
          analysisId: String(clearance.analysisId),
          fabName: clearance.fabName,
          process: clearance.process,
        }
      : null,
  };
  const under = revision.reviewAnalysisId === null ? null : await loadAnalysis(ctx, revision.id, revision.reviewAnalysisId);
  return { revision, chip: { id: chip.id, name: chip.name }, state, analysis: under?.analysis ?? null, analysisDoc: under?.doc ?? null, dispositionHistory, clearance };
}

/** What a step request carries beyond the machine's event. */
export type StepInput =
  | { type: "submit"; expectedVersion: number; note: string; analysisId?: number | null }
  | { type: "update_analysis"; expectedVersion: number; analysisId: number; note?: string | null }
  | { type: "dispose_flag"; expectedVersion: number; flagKey: string; decision: FlagDecision; justification?: string | null }
  | { type: "pass_fluidics"; expectedVersion: number; note?: string | null }
  | { type: "request_changes"; expectedVersion: number; note: string }
  | { type: "clear"; expectedVersion: number; fabName: string; process: string; password: string }
  | { type: "withdraw"; expectedVersion: number; reason?: string | null };

/** The newest successful analysis of the revision with an operating point (totals), or null. */
async function latestAnalysedOperatingPoint(ctx: MemberContext, revisionId: number): Promise<number | null> {
  const list = await chipsQ.listAnalyses(ctx.scope, revisionId);
  const ok = list.find((a) => a.status === "ok" && a.totalFlowM3PerS !== null);
  return ok?.id ?? list.find((a) => a.status === "ok")?.id ?? null;
}

async function checkSignature(ctx: MemberContext, password: string, now: Date): Promise<"verified" | "failed"> {
  const { failures, oldestAt } = await q.countSignatureFailuresSince(ctx.scope, new Date(now.getTime() - SIGNATURE_WINDOW_MS));
  if (failures >= MAX_SIGNATURE_FAILURES) {
    const m = oldestAt ? Math.max(1, Math.ceil((oldestAt.getTime() + SIGNATURE_WINDOW_MS - now.getTime()) / 60000)) : 15;
    throw new RateLimitedError(`Too many failed signatures. Wait ${m} minute${m === 1 ? "" : "s"} before signing again, or reset your password.`, m * 60);
  }
  const hash = await q.getPasswordHash(ctx.user.id);
  return hash !== null && password.length > 0 && (await verifyPassword(password, hash)) ? "verified" : "failed";
}

function isBusy(err: unknown): boolean {
  const code = (err as { code?: unknown })?.code;
  const cause = (err as { cause?: { code?: unknown } })?.cause?.code;
  return [code, cause].some((c) => typeof c === "string" && c.startsWith("SQLITE_BUSY"));
}

type TxWork<T> = Parameters<ReturnType<typeof getDb>["transaction"]>[0] extends (tx: infer X) => Promise<unknown> ? (tx: X) => Promise<T> : never;

/** Review writes of this process, one at a time (see writeTransaction). */
let writeQueue: Promise<unknown> = Promise.resolve();

/**
 * Runs a write transaction. Within one server process review writes queue up
 * behind each other, because SQLite allows one writer and libSQL's embedded
 * client answers a second concurrent BEGIN with SQLITE_BUSY; across processes
 * a busy database is retried briefly. Either way the compare-and-set inside
 * decides who wins.
 */
async function writeTransaction<T>(work: TxWork<T>): Promise<T> {
  const run = async (): Promise<T> => {
    for (let attempt = 0; ; attempt++) {
      try {
        return await getDb().transaction(work);
      } catch (err) {
        if (!isBusy(err) || attempt >= 20) throw err;
        await new Promise((r) => setTimeout(r, 25 + Math.random() * 50));
      }
    }
  };
  const result = writeQueue.then(run, run);
  writeQueue = result.catch(() => undefined);
  return result;
}

export type StepOutcome = {
  status: ReviewStatus;
  statusLabel: string;
  version: number;
  audit: string;
  notified: number;
  emailed: number;
};

/**
 * Takes one review step on a revision.
 * @param ctx the member acting (authorised for the workspace and the step's role)
 * @param revisionId the revision's id
 * @param input the step with the review version the caller loaded
 * @throws ForbiddenError/FourEyesError (403) wrong role or the uploader reviewing; SignatureError (403) wrong password;
 *   RateLimitedError (429) too many failed signatures; ConflictError (409) wrong state, open flags, frozen;
 *   StaleVersionError (409) someone acted first; NotFoundError (404); DomainError (400/422) bad input.
 */
export async function takeReviewStep(ctx: MemberContext, revisionId: number, input: StepInput, now = new Date()): Promise<StepOutcome> {
  const loaded = await loadReview(ctx, revisionId);
  const { revision, state } = loaded;
  let analysis = loaded.analysis;
  if (input.type === "submit" || input.type === "update_analysis") {
    const chosen = input.analysisId ?? (await latestAnalysedOperatingPoint(ctx, revision.id));
    const found = chosen === null ? null : await loadAnalysis(ctx, revision.id, chosen);
    if (chosen !== null && !found) {
      throw new DomainError("unknown_analysis", "That analysis is not a successful analysis of this revision; choose one from the revision's analyses.", 422);
    }
    analysis = found?.analysis ?? null;
  }
  let passwordCheck: "verified" | "failed" | undefined;
  let fileSha256: string | undefined;
  if (input.type === "clear") {
    passwordCheck = await checkSignature(ctx, input.password, now);
    // The digest is of the bytes in storage now, so the record proves which file was cleared.
    fileSha256 = sha256Hex(await getFile(revision.storageKey));
    if (fileSha256 !== revision.sha256) {
      throw new ConflictError("file_changed", "The stored file no longer matches the digest recorded at upload; it cannot be cleared. Tell your admin.");
    }
  }
  const event = toEvent(input);
  const actor = { memberId: String(ctx.user.id), roles: ctx.scope.roles };
  let result;
  try {
    result = transition(state, event, actor, { nowIso: now.toISOString(), analysis, fileSha256, passwordCheck });
  } catch (err) {
    if (err instanceof SignatureError) {
      await recordAuditEvent({
        workspaceId: ctx.workspace.id,
        actorUserId: ctx.user.id,
        action: "review.signature_failed",
        objectType: "revision",
        objectId: revision.id,
        at: now,
      });
    }
    throw err;
  }
  const { next, nextVersion, effects } = result;
  const members = await listWorkspaceMembers(ctx.scope);
  const facts: RevisionFacts = { revisionId: revision.id, chipId: loaded.chip.id, chipName: loaded.chip.name, number: revision.number };
  const planned = planNotifications(effects.notifications, members, { userId: ctx.user.id, name: ctx.user.name }, facts);

  await writeTransaction(async (tx) => {
    const moved = await q.compareAndSetReview(tx, ctx.scope, revision.id, state.version, {
      state: next.status,
      version: nextVersion,
      analysisId: next.analysisId === null ? null : Number(next.analysisId),
      since: next.status !== state.status ? now : null,
    });
    if (!moved) throw new StaleVersionError(state.version);
    if (input.type === "dispose_flag") {
      const d = next.dispositions.find((x) => x.flagKey === input.flagKey)!;
      await q.insertDisposition(tx, ctx.scope, {
        revisionId: revision.id,
        analysisId: Number(d.analysisId),
        flagKey: d.flagKey,
        decision: d.decision,
        justification: d.justification,
        value: d.value,
        byUserId: ctx.user.id,
        at: now,
      });
    }
    if (input.type === "clear" && next.clearance) {
      const c = next.clearance;
      await q.insertClearance(tx, ctx.scope, {
        revisionId: revision.id,
        byUserId: ctx.user.id,
        at: now,
        fabName: c.fabName,
        process: c.process,
        fileSha256: c.fileSha256,
        analysisId: Number(c.analysisId),
      });
    }
    await recordAuditEvent(
      {
        workspaceId: ctx.workspace.id,
        actorUserId: ctx.user.id,
        action: effects.audit.action,
        objectType: "revision",
        objectId: revision.id,
        details: { ...effects.audit.details, version: nextVersion, chipId: loaded.chip.id, number: revision.number },
        at: now,
      },
      tx,
    );
    await q.insertNotifications(
      tx,
      ctx.scope,
      planned.map((p) => ({ userId: p.userId, kind: p.kind, revisionId: revision.id, actorUserId: ctx.user.id, summary: p.summary, details: p.details, createdAt: now })),
    );
    await chipsQ.touchChip(tx, ctx.scope, loaded.chip.id, now);
  });

  const mail = await deliverEmails(ctx.scope, ctx.workspace, planned, members, ctx.user.name, facts);
  return { status: next.status, statusLabel: STATUS_LABELS[next.status], version: nextVersion, audit: effects.audit.action, notified: planned.length, emailed: mail.sent };
}

function toEvent(input: StepInput): ReviewEvent {
  switch (input.type) {
    case "submit":
      return { type: "submit", expectedVersion: input.expectedVersion, note: input.note };
    case "update_analysis":
      return { type: "update_analysis", expectedVersion: input.expectedVersion, note: input.note ?? null };
    case "dispose_flag":
      return { type: "dispose_flag", expectedVersion: input.expectedVersion, flagKey: input.flagKey, decision: input.decision, justification: input.justification ?? null };
    case "pass_fluidics":
      return { type: "pass_fluidics", expectedVersion: input.expectedVersion, note: input.note ?? null };
    case "request_changes":
      return { type: "request_changes", expectedVersion: input.expectedVersion, note: input.note };
    case "clear":
      return { type: "clear", expectedVersion: input.expectedVersion, fabName: input.fabName, process: input.process };
    case "withdraw":
      return { type: "withdraw", expectedVersion: input.expectedVersion, reason: input.reason ?? null };
  }
}

export type CommentInput = {
  body: string;
  parentId?: number | null;
  segmentId?: string | null;
  point?: { x_m: number; y_m: number } | null;
};

/**
 * Adds a comment (or a reply) to a revision's review, notifying the members it
 * @mentions. Allowed in every review state.
 * @throws ForbiddenError (403) for leads; DomainError (400) empty/over-long/bad pin; NotFoundError (404) unknown parent.
 */
export async function addComment(ctx: MemberContext, revisionId: number, input: CommentInput, now = new Date()): Promise<{ id: number; mentioned: number[] }> {
  const revision = await chipsQ.getRevisionById(ctx.scope, revisionId);
  if (!revision) throw new NotFoundError("That revision does not exist in this workspace.");
  const chip = await chipsQ.getChip(ctx.scope, revision.chipId);
  let parentId: number | null = null;
  if (input.parentId) {
    const parent = await q.getComment(ctx.scope, input.parentId);
    if (!parent || parent.revisionId !== revision.id) throw new NotFoundError("The comment you are answering does not exist on this revision.");
    // Replies hang off the thread's first comment, so threads stay one level deep.
    parentId = parent.parentId ?? parent.id;
  }
  const segmentId = input.segmentId?.trim() ? input.segmentId.trim().slice(0, 100) : null;
  const members = await listWorkspaceMembers(ctx.scope);
  const plan = planComment(
    { memberId: String(ctx.user.id), roles: ctx.scope.roles },
    input.body,
    members.map((m) => ({ id: String(m.userId), name: m.name, email: m.email })),
    { segmentId, point: input.point ?? null, parentId: parentId === null ? null : String(parentId) },
  );
  const facts: RevisionFacts = { revisionId: revision.id, chipId: revision.chipId, chipName: chip?.name ?? "", number: revision.number };
  const planned: PlannedNotification[] = planNotifications(plan.notifications, members, { userId: ctx.user.id, name: ctx.user.name }, facts);
  const mentioned = plan.mentionedMemberIds.map(Number);
  const id = await writeTransaction(async (tx) => {
    const commentId = await q.insertComment(tx, ctx.scope, {
      revisionId: revision.id,
      parentId,
      authorUserId: ctx.user.id,
      body: plan.body,
      segmentId,
      xM: input.point?.x_m ?? null,
      yM: input.point?.y_m ?? null,
      mentions: mentioned,
      createdAt: now,
    });
    await recordAuditEvent(
      {
        workspaceId: ctx.workspace.id,
        actorUserId: ctx.user.id,
        action: plan.audit.action,
        objectType: "revision",
        objectId: revision.id,
        details: { ...plan.audit.details, commentId },
        at: now,
      },
      tx,
    );
    await q.insertNotifications(
      tx,
      ctx.scope,
      planned.map((p) => ({ userId: p.userId, kind: p.kind, revisionId: revision.id, actorUserId: ctx.user.id, summary: p.summary, details: { ...p.details, commentId }, createdAt: now })),
    );
    return commentId;
  });
  await deliverEmails(ctx.scope, ctx.workspace, planned, members, ctx.user.name, facts);
  return { id, mentioned };
}

/**
 * Marks a comment resolved or open again. Any member with a working role may
 * (leads read only).
 * @throws ForbiddenError (403) for leads; NotFoundError (404); ConflictError (409) when already so.
 */
export async function setCommentResolved(ctx: MemberContext, revisionId: number, commentId: number, resolved: boolean, now = new Date()): Promise<void> {
  if (!ctx.scope.roles.some((r) => r !== "lead")) {
    throw new DomainError("forbidden", "Leads can read review comments but not resolve them.", 403);
  }
  const comment = await q.getComment(ctx.scope, commentId);
  if (!comment || comment.revisionId !== revisionId) throw new NotFoundError("That comment does not exist on this revision.");
  if ((comment.resolvedAt !== null) === resolved) {
    throw new ConflictError("comment_unchanged", resolved ? "That comment is already resolved." : "That comment is already open.");
  }
  await writeTransaction(async (tx) => {
    await q.setCommentResolved(tx, ctx.scope, commentId, resolved ? { at: now, byUserId: ctx.user.id } : null);
    await recordAuditEvent(
      {
        workspaceId: ctx.workspace.id,
        actorUserId: ctx.user.id,
        action: resolved ? "review.comment_resolved" : "review.comment_reopened",
        objectType: "revision",
        objectId: revisionId,
        details: { commentId },
        at: now,
      },
      tx,
    );
  });
}

export type ReviewOverview = LoadedReview & {
  statusLabel: string;
  /** Steps the signed-in member may take now. */
  allowed: ReviewEventType[];
  checklist: FlagChecklistItem[];
  comments: q.CommentView[];
  members: MemberView[];
  /** Successful analyses of the revision, newest first, for submit / update. */
  candidates: { id: number; name: string; createdAt: Date; hasOperatingPoint: boolean; flagsBlock: number; flagsWarn: number }[];
};

/** Everything the review screen and GET …/review show, for the signed-in member. */
export async function getReviewOverview(ctx: MemberContext, revisionId: number): Promise<ReviewOverview> {
  const loaded = await loadReview(ctx, revisionId);
  const [comments, members, analyses] = await Promise.all([
    q.listComments(ctx.scope, revisionId),
    listWorkspaceMembers(ctx.scope),
    chipsQ.listAnalyses(ctx.scope, revisionId),
  ]);
  const isUploader = loaded.revision.uploadedByUserId === ctx.user.id;
  return {
    ...loaded,
    statusLabel: STATUS_LABELS[loaded.state.status],
    allowed: allowedEvents(loaded.state, ctx.scope.roles, isUploader),
    checklist: loaded.analysis ? reviewChecklist(loaded.state, loaded.analysis) : [],
    comments,
    members,
    candidates: analyses
      .filter((a) => a.status === "ok")
      .map((a) => ({ id: a.id, name: a.operatingPointName, createdAt: a.createdAt, hasOperatingPoint: a.totalFlowM3PerS !== null, flagsBlock: a.flagsBlock, flagsWarn: a.flagsWarn })),
  };
}

/** The revision's audit events, oldest first. */
export async function listRevisionAudit(ctx: MemberContext, revisionId: number): Promise<AuditView[]> {
  const revision = await chipsQ.getRevisionById(ctx.scope, revisionId);
  if (!revision) throw new NotFoundError("That revision does not exist in this workspace.");
  const events = await listAuditEvents(ctx.scope, { objectType: "revision", objectId: revisionId, limit: 10000 });
  return events.reverse();
}

export const AUDIT_CSV_HEADER = ["id", "at_utc", "actor", "action", "details_json"] as const;

/** The audit trail as RFC 4180 CSV (lib/analysis/csv formatCsv) and as JSON-ready objects. */
export function auditToCsv(events: readonly AuditView[]): string {
  return formatCsv([[...AUDIT_CSV_HEADER], ...events.map((e) => [e.id, e.at.toISOString(), e.actor ?? "", e.action, JSON.stringify(e.details)])]);
}

export function auditToJson(events: readonly AuditView[]) {
  return events.map((e) => ({ id: e.id, at: e.at.toISOString(), actor: e.actor, action: e.action, details: e.details }));
}
