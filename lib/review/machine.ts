/**
 * The review path of a revision as a pure state machine:
 * `transition(state, event, actor, context) → { next, nextVersion, effects }`,
 * or a typed DomainError. No clock, no I/O: the service passes the time, the
 * analysis under review, the file's digest and the password check's outcome in
 * `context`, writes `next` with a compare-and-set on `version`, then writes the
 * returned audit event and sends the returned notifications.
 *
 * The path, in plain words:
 *   draft ──submit──▶ with_fluidics ──pass_fluidics──▶ with_fab ──clear──▶ cleared (frozen)
 *                        │   ▲  ↺ update_analysis (designer's fix)  │
 *          request_changes   └──submit── changes_requested ◀── request_changes
 *   any state before cleared ──withdraw (uploader)──▶ withdrawn
 */
import { ConflictError, DomainError, ForbiddenError } from "../errors";
import { ROLES, type Role } from "../auth/roles";
import { FourEyesError, SignatureError, StaleVersionError } from "./errors";

export { ROLES, type Role };

export const REVIEW_STATUSES = ["draft", "with_fluidics", "with_fab", "changes_requested", "cleared", "withdrawn"] as const;
export type ReviewStatus = (typeof REVIEW_STATUSES)[number];

/** Words for the UI and for messages. */
export const STATUS_LABELS: Record<ReviewStatus, string> = {
  draft: "Draft",
  with_fluidics: "With fluidics review",
  with_fab: "With fab review",
  changes_requested: "Changes requested",
  cleared: "Cleared for tape-out",
  withdrawn: "Withdrawn",
};

/** Shortest waiver justification accepted, in characters (trimmed). Common practice: long enough to force a sentence. */
export const MIN_WAIVER_JUSTIFICATION_CHARS = 20;
/** Longest free text accepted in notes, justifications, fab and process names. */
export const MAX_NOTE_CHARS = 4000;
export const MAX_NAME_CHARS = 200;

export type FlagDecision = "waived" | "must_fix";

/** A reviewer's decision on one flag, keyed by `flagKey` so it survives a re-analysis. */
export interface FlagDisposition {
  flagKey: string;
  decision: FlagDecision;
  /** Required (≥ MIN_WAIVER_JUSTIFICATION_CHARS) for a waiver; optional note for must-fix. */
  justification: string | null;
  /** The flag's value when it was decided; a waiver stops counting when the value changes. */
  value: number | null;
  analysisId: string;
  byMemberId: string;
  atIso: string;
}

/** The signature recorded when a fab liaison clears a revision. */
export interface Clearance {
  byMemberId: string;
  atIso: string;
  fileSha256: string;
  analysisId: string;
  fabName: string;
  process: string;
}

export interface ReviewState {
  status: ReviewStatus;
  /** Bumped by every transition; the service updates `WHERE version = expected`. */
  version: number;
  uploadedByMemberId: string;
  /** The analysed operating point under review (set on submit), null in a fresh draft. */
  analysisId: string | null;
  dispositions: FlagDisposition[];
  clearance: Clearance | null;
}

/** A flag of the analysis under review, as the machine needs it. */
export interface ReviewFlag {
  key: string;
  code: string;
  /** "info" | "warn" | "block" (lib/hydraulics/types.ts FlagSeverity). */
  severity: string;
  value: number | null;
  title?: string;
}

/** The analysis the service loaded for this revision (the current one). */
export interface ReviewAnalysis {
  id: string;
  /** True when hydraulics were solved (an operating point), false for geometry only. */
  hasOperatingPoint: boolean;
  flags: ReviewFlag[];
}

export interface ReviewActor {
  memberId: string;
  roles: readonly Role[];
}

export interface ReviewContext {
  /** The time of the action, ISO 8601, from the service's clock. */
  nowIso: string;
  /** The revision's current analysis; required by submit, dispose_flag, pass_fluidics, clear. */
  analysis?: ReviewAnalysis | null;
  /** SHA-256 of the revision's file (64 hex digits); required by clear. */
  fileSha256?: string;
  /** Outcome of the password re-entry the service checked; required by clear. */
  passwordCheck?: "verified" | "failed";
}

export type ReviewEvent =
  | { type: "submit"; expectedVersion: number; note: string }
  | { type: "update_analysis"; expectedVersion: number; note?: string | null }
  | { type: "dispose_flag"; expectedVersion: number; flagKey: string; decision: FlagDecision; justification?: string | null }
  | { type: "pass_fluidics"; expectedVersion: number; note?: string | null }
  | { type: "request_changes"; expectedVersion: number; note: string }
  | { type: "clear"; expectedVersion: number; fabName: string; process: string }
  | { type: "withdraw"; expectedVersion: number; reason?: string | null };

export type ReviewEventType = ReviewEvent["type"];
export const REVIEW_EVENT_TYPES: readonly ReviewEventType[] = ["submit", "update_analysis", "dispose_flag", "pass_fluidics", "request_changes", "clear", "withdraw"];

export type NotificationKind = "review_requested" | "changes_requested" | "cleared" | "mentioned";

/** Who receives a notification: one member, or every member holding a role (minus some members). */
export type Recipient = { memberId: string } | { role: Role; exceptMemberIds: string[] };

export interface ReviewNotification {
  kind: NotificationKind;
  to: Recipient[];
  details: Record<string, unknown>;
}

export interface AuditEvent {
  /** Stable action name, e.g. "review.submitted". */
  action: string;
  details: Record<string, unknown>;
}

export interface TransitionResult {
  next: ReviewState;
  nextVersion: number;
  effects: { audit: AuditEvent; notifications: ReviewNotification[] };
}

/** A fresh revision's review record, before anything has happened. */
export function createReviewState(uploadedByMemberId: string): ReviewState {
  return { status: "draft", version: 0, uploadedByMemberId, analysisId: null, dispositions: [], clearance: null };
}

/** The key a disposition is stored under: rule code + target, stable across re-analyses of the same layout. */
export function flagKey(flag: { code: string; target: { kind: string; id: string | null } }): string {
  return `${flag.code}|${flag.target.kind}|${flag.target.id ?? "*"}`;
}

/** Reduce an analyze document (lib/analysis/serialize.ts shape) to what the machine needs. */
export function toReviewAnalysis(
  analysisId: string,
  doc: { totals: unknown; flags: { code: string; severity: string; target: { kind: string; id: string | null }; value: number | null; title: string }[] },
): ReviewAnalysis {
  return {
    id: analysisId,
    hasOperatingPoint: doc.totals !== null,
    flags: doc.flags.map((f) => ({ key: flagKey(f), code: f.code, severity: f.severity, value: f.value, title: f.title })),
  };
}

/** A cleared revision is frozen: no new operating points, edits or review steps. */
export function isFrozen(state: Pick<ReviewState, "status">): boolean {
  return state.status === "cleared";
}

/**
 * Guard for edits to a revision (new operating points, layer mapping, file replacement).
 * @throws ConflictError (409) when the revision is cleared (frozen) or withdrawn.
 */
export function assertEditable(state: Pick<ReviewState, "status">): void {
  if (state.status === "cleared") {
    throw new ConflictError(
      "revision_frozen",
      "This revision is cleared for tape-out and frozen; upload the changed layout as a new revision (the clearance stays on record).",
    );
  }
  if (state.status === "withdrawn") {
    throw new ConflictError("revision_withdrawn", "This revision was withdrawn; upload the layout again as a new revision.");
  }
}

interface Gate {
  /** Roles that may take the step (any one suffices). */
  roles: readonly Role[];
  /** States the step may start from. */
  from: readonly ReviewStatus[];
  /** "forbidden": the uploader may not take it (four-eyes); "required": only the uploader may. */
  uploader: "allowed" | "forbidden" | "required";
  /** What the step is called in messages. */
  doing: string;
}

const BEFORE_CLEARANCE: readonly ReviewStatus[] = ["draft", "with_fluidics", "with_fab", "changes_requested"];

const GATES: Record<ReviewEventType, Gate> = {
  submit: { roles: ["designer"], from: ["draft", "changes_requested"], uploader: "allowed", doing: "submit it for review" },
  update_analysis: { roles: ["designer"], from: ["with_fluidics"], uploader: "allowed", doing: "put a newer analysis under review" },
  dispose_flag: { roles: ["fluidics_reviewer"], from: ["with_fluidics"], uploader: "forbidden", doing: "dispose of its flags" },
  pass_fluidics: { roles: ["fluidics_reviewer"], from: ["with_fluidics"], uploader: "forbidden", doing: "pass its fluidics review" },
  request_changes: { roles: ["fluidics_reviewer", "fab_liaison"], from: ["with_fluidics", "with_fab"], uploader: "forbidden", doing: "request changes" },
  clear: { roles: ["fab_liaison"], from: ["with_fab"], uploader: "forbidden", doing: "clear it for tape-out" },
  withdraw: { roles: ["designer"], from: BEFORE_CLEARANCE, uploader: "required", doing: "withdraw it" },
};

const ROLE_WORDS: Record<Role, string> = {
  admin: "an admin",
  designer: "a designer",
  fluidics_reviewer: "a fluidics reviewer",
  fab_liaison: "a fab liaison",
  lead: "a lead",
};

/** Which role may act in a given state for a two-role step (request_changes). */
function rolesFor(event: ReviewEventType, status: ReviewStatus): readonly Role[] {
  if (event === "request_changes") {
    if (status === "with_fluidics") return ["fluidics_reviewer"];
    if (status === "with_fab") return ["fab_liaison"];
  }
  return GATES[event].roles;
}

/** Role, four-eyes and state checks shared by `transition` and `allowedEvents`; returns the error instead of throwing. */
function gateError(event: ReviewEventType, status: ReviewStatus, roles: readonly Role[], isUploader: boolean): DomainError | null {
  const gate = GATES[event];
  if (!gate.roles.some((r) => roles.includes(r))) {
    const who = gate.roles.map((r) => ROLE_WORDS[r]).join(" or ");
    const lead = roles.length > 0 && roles.every((r) => r === "lead") ? " Leads can read every review but take no steps in it." : "";
    return new ForbiddenError(`Only ${who} can ${gate.doing}.${lead}`);
  }
  if (gate.uploader === "forbidden" && isUploader) {
    return new FourEyesError(`You uploaded this revision, so you cannot ${gate.doing}; another member must do it (four-eyes rule).`);
  }
  if (gate.uploader === "required" && !isUploader) {
    return new ForbiddenError(`Only the designer who uploaded this revision can ${gate.doing}.`);
  }
  if (!gate.from.includes(status)) {
    return new ConflictError(
      "wrong_state",
      `This revision is ${STATUS_LABELS[status].toLowerCase()}, so you cannot ${gate.doing} now` +
        `; that is possible only when it is ${gate.from.map((s) => STATUS_LABELS[s].toLowerCase()).join(" or ")}.`,
      { status, event, allowedFrom: gate.from },
    );
  }
  // Both roles may request changes, but each only at their own stage.
  const stageRoles = rolesFor(event, status);
  if (!stageRoles.some((r) => roles.includes(r))) {
    return new ForbiddenError(`At this stage only ${stageRoles.map((r) => ROLE_WORDS[r]).join(" or ")} can ${gate.doing}.`);
  }
  return null;
}

/**
 * The steps this member may take now, for the UI to decide what to show. The
 * server still calls `transition`, which also checks the step's inputs.
 */
export function allowedEvents(state: Pick<ReviewState, "status">, actorRoles: readonly Role[], isUploader: boolean): ReviewEventType[] {
  return REVIEW_EVENT_TYPES.filter((e) => gateError(e, state.status, actorRoles, isUploader) === null);
}

function requireText(value: unknown, field: string, what: string, minChars = 1, maxChars = MAX_NOTE_CHARS): string {
  const text = typeof value === "string" ? value.trim() : "";
  if (text.length < minChars) {
    const need = minChars > 1 ? ` of at least ${minChars} characters` : "";
    throw new DomainError("invalid_review_input", `${field} is required${need}: ${what}`, 400, { field });
  }
  if (text.length > maxChars) {
    throw new DomainError("invalid_review_input", `${field} is too long (${text.length} characters); keep it under ${maxChars}.`, 400, { field });
  }
  return text;
}

function optionalText(value: unknown, field: string): string | null {
  if (value === undefined || value === null || (typeof value === "string" && value.trim() === "")) return null;
  return requireText(value, field, "", 1);
}

function requireAnalysis(context: ReviewContext, state: ReviewState, mustMatchState: boolean): ReviewAnalysis {
  const analysis = context.analysis ?? null;
  if (!analysis) {
    throw new ConflictError("no_analysis", "This revision has no analysis yet; analyse it at an operating point first.");
  }
  if (mustMatchState && analysis.id !== state.analysisId) {
    throw new ConflictError(
      "analysis_changed",
      "The analysis under review has changed since this page was loaded; reload to review the current one.",
      { underReview: state.analysisId, given: analysis.id },
    );
  }
  return analysis;
}

/** A waiver counts while the flag's value is what the reviewer saw (re-analysis that moves the value reopens it). */
function sameValue(a: number | null, b: number | null): boolean {
  if (a === null || b === null) return a === b;
  return Math.abs(a - b) <= 1e-9 * Math.max(Math.abs(a), Math.abs(b));
}

export type FlagReviewStatus = "open" | "waived" | "must_fix" | "fixed";

export interface FlagChecklistItem {
  flagKey: string;
  code: string | null;
  severity: string | null;
  status: FlagReviewStatus;
  disposition: FlagDisposition | null;
}

/**
 * Where each flag stands for the analysis under review: raised flags are open,
 * waived or must-fix; dispositions whose flag the current analysis no longer
 * raises are listed as fixed.
 */
export function reviewChecklist(state: Pick<ReviewState, "dispositions">, analysis: ReviewAnalysis): FlagChecklistItem[] {
  const byKey = new Map(state.dispositions.map((d) => [d.flagKey, d]));
  const raised = new Set(analysis.flags.map((f) => f.key));
  const items: FlagChecklistItem[] = analysis.flags.map((f) => {
    const d = byKey.get(f.key) ?? null;
    let status: FlagReviewStatus = "open";
    if (d?.decision === "must_fix") status = "must_fix";
    else if (d?.decision === "waived" && d.justification && sameValue(d.value, f.value)) status = "waived";
    return { flagKey: f.key, code: f.code, severity: f.severity, status, disposition: d };
  });
  for (const d of state.dispositions) {
    if (!raised.has(d.flagKey)) items.push({ flagKey: d.flagKey, code: d.flagKey.split("|")[0] ?? null, severity: null, status: "fixed", disposition: d });
  }
  return items;
}

const fluidicsReviewers = (state: ReviewState): Recipient => ({ role: "fluidics_reviewer", exceptMemberIds: [state.uploadedByMemberId] });

/**
 * Apply one review step.
 * @param state the stored review record
 * @param event the step, with the `expectedVersion` the caller loaded
 * @param actor the member acting and their roles on this chip's team
 * @param context time, current analysis, file digest, password check (see ReviewContext)
 * @returns the next record, `nextVersion` for the compare-and-set, and the audit event and notifications to write
 * @throws ForbiddenError (403) wrong role; FourEyesError (403) uploader reviewing; SignatureError (403) password not verified;
 *   ConflictError (409) wrong state, stale version, open block flags, analysis changed; DomainError (400/422) bad input.
 */
export function transition(state: ReviewState, event: ReviewEvent, actor: ReviewActor, context: ReviewContext): TransitionResult {
  const isUploader = actor.memberId === state.uploadedByMemberId;
  const refused = gateError(event.type, state.status, actor.roles, isUploader);
  if (refused) throw refused;
  if (event.expectedVersion !== state.version) throw new StaleVersionError(event.expectedVersion, state.version);

  const nextVersion = state.version + 1;
  const base: ReviewState = { ...state, version: nextVersion };
  const done = (next: ReviewState, audit: AuditEvent, notifications: ReviewNotification[] = []): TransitionResult => ({
    next,
    nextVersion,
    effects: { audit, notifications },
  });
  const from = state.status;

  switch (event.type) {
    case "submit": {
      const note = requireText(event.note, "A note", "say what changed in this revision and why.");
      const analysis = requireAnalysis(context, state, false);
      if (!analysis.hasOperatingPoint) {
        throw new ConflictError(
          "no_operating_point",
          "Submit an analysed operating point: this analysis has geometry only. Set the port conditions and analyse it, then submit.",
        );
      }
      const resubmitted = from === "changes_requested";
      return done(
        { ...base, status: "with_fluidics", analysisId: analysis.id },
        { action: "review.submitted", details: { from, to: "with_fluidics", note, analysisId: analysis.id, resubmitted } },
        [{ kind: "review_requested", to: [fluidicsReviewers(state)], details: { stage: "fluidics", note, analysisId: analysis.id, resubmitted } }],
      );
    }

    case "update_analysis": {
      // The designer's fix during fluidics review: a newer analysed operating point replaces the one under review.
      // Dispositions stay keyed by flag, so a must-fix flag the new analysis no longer raises counts as fixed.
      const note = optionalText(event.note, "The note");
      const analysis = requireAnalysis(context, state, false);
      if (!analysis.hasOperatingPoint) {
        throw new ConflictError("no_operating_point", "Put an analysed operating point under review: this analysis has geometry only.");
      }
      if (analysis.id === state.analysisId) {
        throw new ConflictError("analysis_unchanged", "This analysis is already the one under review; analyse the fixed layout first.");
      }
      return done(
        { ...base, analysisId: analysis.id },
        { action: "review.analysis_updated", details: { previousAnalysisId: state.analysisId, analysisId: analysis.id, note } },
        [{ kind: "review_requested", to: [fluidicsReviewers(state)], details: { stage: "fluidics", note, analysisId: analysis.id, updated: true } }],
      );
    }

    case "dispose_flag": {
      const analysis = requireAnalysis(context, state, true);
      const flag = analysis.flags.find((f) => f.key === event.flagKey);
      if (!flag) {
        throw new DomainError("unknown_flag", "That flag is not raised by the analysis under review; reload the flags list.", 422, { flagKey: event.flagKey });
      }
      if (event.decision !== "waived" && event.decision !== "must_fix") {
        throw new DomainError("invalid_review_input", "Choose a decision for the flag: waive it with a justification, or mark it must-fix.", 400);
      }
      const justification =
        event.decision === "waived"
          ? requireText(event.justification, "A justification", "explain why this flag is acceptable for this design.", MIN_WAIVER_JUSTIFICATION_CHARS)
          : optionalText(event.justification, "The must-fix note");
      const disposition: FlagDisposition = {
        flagKey: flag.key,
        decision: event.decision,
        justification,
        value: flag.value,
        analysisId: analysis.id,
        byMemberId: actor.memberId,
        atIso: context.nowIso,
      };
      const previous = state.dispositions.find((d) => d.flagKey === flag.key) ?? null;
      return done(
        { ...base, dispositions: [...state.dispositions.filter((d) => d.flagKey !== flag.key), disposition] },
        {
          action: event.decision === "waived" ? "review.flag_waived" : "review.flag_must_fix",
          details: { flagKey: flag.key, code: flag.code, severity: flag.severity, value: flag.value, justification, analysisId: analysis.id, previousDecision: previous?.decision ?? null },
        },
      );
    }

    case "pass_fluidics": {
      const analysis = requireAnalysis(context, state, true);
      const note = optionalText(event.note, "The note");
      const checklist = reviewChecklist(state, analysis);
      const openBlocks = checklist.filter((i) => i.severity === "block" && i.status === "open");
      const mustFix = checklist.filter((i) => i.status === "must_fix");
      if (openBlocks.length > 0 || mustFix.length > 0) {
        const parts: string[] = [];
        if (openBlocks.length > 0) parts.push(`${openBlocks.length} blocking flag(s) still need a waiver with a justification or a fix`);
        if (mustFix.length > 0) parts.push(`${mustFix.length} flag(s) marked must-fix are still raised by the current analysis`);
        throw new ConflictError("flags_unresolved", `The fluidics review cannot pass yet: ${parts.join("; ")}. Dispose of them, or request changes.`, {
          openBlockFlags: openBlocks.map((i) => i.flagKey),
          mustFixFlags: mustFix.map((i) => i.flagKey),
        });
      }
      const waived = checklist.filter((i) => i.status === "waived").map((i) => i.flagKey);
      const fixed = checklist.filter((i) => i.status === "fixed").map((i) => i.flagKey);
      return done(
        { ...base, status: "with_fab" },
        { action: "review.fluidics_passed", details: { from, to: "with_fab", note, analysisId: analysis.id, waived, fixed } },
        [{ kind: "review_requested", to: [{ role: "fab_liaison", exceptMemberIds: [state.uploadedByMemberId] }], details: { stage: "fab", analysisId: analysis.id } }],
      );
    }

    case "request_changes": {
      const note = requireText(event.note, "A note", "tell the designer what to change.");
      const stage = from === "with_fluidics" ? "fluidics" : "fab";
      return done(
        { ...base, status: "changes_requested" },
        { action: "review.changes_requested", details: { from, to: "changes_requested", stage, note, analysisId: state.analysisId } },
        [{ kind: "changes_requested", to: [{ memberId: state.uploadedByMemberId }], details: { stage, note } }],
      );
    }

    case "clear": {
      if (context.passwordCheck !== "verified") throw new SignatureError();
      const fabName = requireText(event.fabName, "The fab", "name the fab that will make this chip.", 1, MAX_NAME_CHARS);
      const process = requireText(event.process, "The process", "name the fab's process this revision is cleared for.", 1, MAX_NAME_CHARS);
      const analysis = requireAnalysis(context, state, true);
      const fileSha256 = (context.fileSha256 ?? "").toLowerCase();
      if (!/^[0-9a-f]{64}$/.test(fileSha256)) {
        throw new DomainError("missing_file_digest", "The revision's file digest (SHA-256) is missing, so the clearance cannot be recorded.", 422);
      }
      const clearance: Clearance = { byMemberId: actor.memberId, atIso: context.nowIso, fileSha256, analysisId: analysis.id, fabName, process };
      return done(
        { ...base, status: "cleared", clearance },
        { action: "review.cleared", details: { from, to: "cleared", ...clearance } },
        [
          {
            kind: "cleared",
            to: [{ memberId: state.uploadedByMemberId }, { role: "lead", exceptMemberIds: [] }],
            details: { fabName, process, fileSha256, analysisId: analysis.id },
          },
        ],
      );
    }

    case "withdraw": {
      const reason = optionalText(event.reason, "The reason");
      return done({ ...base, status: "withdrawn" }, { action: "review.withdrawn", details: { from, to: "withdrawn", reason } });
    }
  }
}
