/**
 * The review path's rules. Source for every rule: issue 7 ("Review and
 * sign-off") — only the named role may take each step, nobody reviews or clears
 * a revision they uploaded (four-eyes, common practice in sign-off workflows),
 * wrong-state steps answer 409, two simultaneous approvals cannot both win,
 * cleared revisions are frozen. Statuses follow RFC 9110 §15.5.4 (403 Forbidden)
 * and §15.5.10 (409 Conflict).
 */
import { describe, expect, it } from "vitest";
import { ConflictError, DomainError, ForbiddenError } from "@/lib/errors";
import { FourEyesError, SignatureError, StaleVersionError } from "@/lib/review/errors";
import {
  MIN_WAIVER_JUSTIFICATION_CHARS,
  REVIEW_EVENT_TYPES,
  REVIEW_STATUSES,
  allowedEvents,
  assertEditable,
  createReviewState,
  flagKey,
  isFrozen,
  reviewChecklist,
  toReviewAnalysis,
  transition,
  type ReviewActor,
  type ReviewAnalysis,
  type ReviewContext,
  type ReviewEvent,
  type ReviewEventType,
  type ReviewState,
  type ReviewStatus,
  type Role,
} from "@/lib/review/machine";

const UPLOADER = "m-ines"; // invented Brookmere Biofluidics designer who uploaded the revision
const designer: ReviewActor = { memberId: UPLOADER, roles: ["designer"] };
const otherDesigner: ReviewActor = { memberId: "m-tomas", roles: ["designer"] };
const fluidics: ReviewActor = { memberId: "m-priya", roles: ["fluidics_reviewer"] };
const fluidics2: ReviewActor = { memberId: "m-olu", roles: ["fluidics_reviewer"] };
const fab: ReviewActor = { memberId: "m-hana", roles: ["fab_liaison"] };
const lead: ReviewActor = { memberId: "m-rafe", roles: ["lead"] };
const admin: ReviewActor = { memberId: "m-sol", roles: ["admin"] };
// The uploader who also holds every reviewing role: four-eyes must still stop them.
const uploaderWithAllRoles: ReviewActor = { memberId: UPLOADER, roles: ["designer", "fluidics_reviewer", "fab_liaison", "admin"] };

const SHA = "a".repeat(64);
const BLOCK = { code: "re_turbulent", target: { kind: "segment", id: "s3" } };
const WARN = { code: "ca_dripping", target: { kind: "segment", id: "s5" } };
const analysisA: ReviewAnalysis = {
  id: "an-1",
  hasOperatingPoint: true,
  flags: [
    { key: flagKey(BLOCK), code: BLOCK.code, severity: "block", value: 2500 },
    { key: flagKey(WARN), code: WARN.code, severity: "warn", value: 0.02 },
  ],
};
const JUSTIFICATION = "Short burst at start-up only; steady flow is laminar.";

const ctx = (over: Partial<ReviewContext> = {}): ReviewContext => ({
  nowIso: "2026-12-01T10:00:00.000Z",
  analysis: analysisA,
  fileSha256: SHA,
  passwordCheck: "verified",
  ...over,
});

function stateIn(status: ReviewStatus, over: Partial<ReviewState> = {}): ReviewState {
  return { ...createReviewState(UPLOADER), status, version: 7, analysisId: status === "draft" ? null : analysisA.id, ...over };
}

/** A valid event of each type for a state at `version`. */
function eventOf(type: ReviewEventType, version: number): ReviewEvent {
  switch (type) {
    case "submit": return { type, expectedVersion: version, note: "Widened the mixer to lower Re." };
    case "update_analysis": return { type, expectedVersion: version, note: "Fixed the turbulent segment." };
    case "dispose_flag": return { type, expectedVersion: version, flagKey: flagKey(BLOCK), decision: "waived", justification: JUSTIFICATION };
    case "pass_fluidics": return { type, expectedVersion: version };
    case "request_changes": return { type, expectedVersion: version, note: "Please fix the turbulent segment." };
    case "clear": return { type, expectedVersion: version, fabName: "Harrowgate Microfab (invented)", process: "SU-8 50 µm on glass" };
    case "withdraw": return { type, expectedVersion: version, reason: "Superseded." };
  }
}

/** The actor who may take each step, and a state it may start from, where all gates pass. */
const RIGHT: Record<ReviewEventType, { actor: ReviewActor; from: ReviewStatus[] }> = {
  submit: { actor: designer, from: ["draft", "changes_requested"] },
  update_analysis: { actor: designer, from: ["with_fluidics"] },
  dispose_flag: { actor: fluidics, from: ["with_fluidics"] },
  // Fluidics reviewers request changes at their stage; fab liaisons at theirs (checked separately below).
  request_changes: { actor: fluidics, from: ["with_fluidics"] },
  pass_fluidics: { actor: fluidics, from: ["with_fluidics"] },
  clear: { actor: fab, from: ["with_fab"] },
  withdraw: { actor: designer, from: ["draft", "with_fluidics", "with_fab", "changes_requested"] },
};

/** States a step may start from (issue 7's path). */
const FROM: Record<ReviewEventType, ReviewStatus[]> = {
  submit: ["draft", "changes_requested"],
  update_analysis: ["with_fluidics"],
  dispose_flag: ["with_fluidics"],
  pass_fluidics: ["with_fluidics"],
  request_changes: ["with_fluidics", "with_fab"],
  clear: ["with_fab"],
  withdraw: ["draft", "with_fluidics", "with_fab", "changes_requested"],
};

/** Roles that may take each step (issue 7). */
const ALLOWED_ROLES: Record<ReviewEventType, Role[]> = {
  submit: ["designer"],
  update_analysis: ["designer"],
  dispose_flag: ["fluidics_reviewer"],
  pass_fluidics: ["fluidics_reviewer"],
  request_changes: ["fluidics_reviewer", "fab_liaison"],
  clear: ["fab_liaison"],
  withdraw: ["designer"],
};
const ALL_ROLES: Role[] = ["admin", "designer", "fluidics_reviewer", "fab_liaison", "lead"];

function thrown(fn: () => unknown): unknown {
  try {
    fn();
  } catch (e) {
    return e;
  }
  throw new Error("expected the step to be refused, but it was accepted");
}

describe("the whole path", () => {
  it("goes draft → with fluidics → with fab → cleared, one version per step, and records the clearance signature", () => {
    let s = createReviewState(UPLOADER);
    expect(s.status).toBe("draft");
    let r = transition(s, eventOf("submit", s.version), designer, ctx());
    expect(r.next.status).toBe("with_fluidics");
    expect(r.nextVersion).toBe(1);
    expect(r.next.version).toBe(r.nextVersion);
    expect(r.next.analysisId).toBe("an-1");
    s = r.next;
    r = transition(s, eventOf("dispose_flag", s.version), fluidics, ctx());
    s = r.next;
    r = transition(s, eventOf("pass_fluidics", s.version), fluidics, ctx());
    expect(r.next.status).toBe("with_fab");
    s = r.next;
    r = transition(s, eventOf("clear", s.version), fab, ctx({ nowIso: "2026-12-01T12:34:56.000Z" }));
    expect(r.next.status).toBe("cleared");
    expect(r.nextVersion).toBe(4);
    // Who, when, the file's SHA-256 and the analysis it was based on (issue 7 step 3).
    expect(r.next.clearance).toEqual({
      byMemberId: fab.memberId,
      atIso: "2026-12-01T12:34:56.000Z",
      fileSha256: SHA,
      analysisId: "an-1",
      fabName: "Harrowgate Microfab (invented)",
      process: "SU-8 50 µm on glass",
    });
    expect(r.effects.audit.action).toBe("review.cleared");
    expect(r.effects.audit.details).toMatchObject({ fileSha256: SHA, analysisId: "an-1", byMemberId: fab.memberId });
    expect(isFrozen(r.next)).toBe(true);
  });

  it("does not modify the state it was given (pure)", () => {
    const s = stateIn("with_fluidics");
    const copy = structuredClone(s);
    transition(s, eventOf("dispose_flag", s.version), fluidics, ctx());
    expect(s).toEqual(copy);
  });
});

describe("wrong role → 403", () => {
  for (const type of REVIEW_EVENT_TYPES) {
    const wrong = ALL_ROLES.filter((r) => !ALLOWED_ROLES[type].includes(r));
    for (const role of wrong) {
      it(`${type} by a member who is only ${role} is forbidden`, () => {
        const s = stateIn(RIGHT[type].from[0]);
        const e = thrown(() => transition(s, eventOf(type, s.version), { memberId: "m-someone", roles: [role] }, ctx()));
        expect(e).toBeInstanceOf(ForbiddenError);
        expect(e).not.toBeInstanceOf(FourEyesError);
        expect((e as DomainError).status).toBe(403);
        expect((e as DomainError).message).toMatch(/^Only /);
      });
    }
  }

  it("a lead is told leads take no steps", () => {
    const s = stateIn("with_fluidics");
    const e = thrown(() => transition(s, eventOf("pass_fluidics", s.version), lead, ctx())) as DomainError;
    expect(e.status).toBe(403);
    expect(e.message).toMatch(/Leads can read/);
    // An admin manages the team but holds no review role unless granted one.
    const a = thrown(() => transition(s, eventOf("pass_fluidics", s.version), admin, ctx())) as DomainError;
    expect(a.status).toBe(403);
    expect(a.message).not.toMatch(/Leads/);
  });

  it("a fab liaison cannot request changes during the fluidics stage, nor a fluidics reviewer during the fab stage", () => {
    const a = thrown(() => transition(stateIn("with_fluidics"), eventOf("request_changes", 7), fab, ctx())) as DomainError;
    expect(a.status).toBe(403);
    expect(a.message).toMatch(/At this stage only a fluidics reviewer/);
    const b = thrown(() => transition(stateIn("with_fab"), eventOf("request_changes", 7), fluidics, ctx())) as DomainError;
    expect(b.status).toBe(403);
    expect(b.message).toMatch(/At this stage only a fab liaison/);
    // …and each may at their own stage.
    expect(transition(stateIn("with_fab"), eventOf("request_changes", 7), fab, ctx()).next.status).toBe("changes_requested");
  });

  it("only the designer who uploaded may withdraw; another designer is forbidden", () => {
    const e = thrown(() => transition(stateIn("with_fluidics"), eventOf("withdraw", 7), otherDesigner, ctx())) as DomainError;
    expect(e.status).toBe(403);
    expect(e.message).toMatch(/who uploaded/);
  });
});

describe("four-eyes: the uploader cannot review their own revision → 403", () => {
  for (const type of ["dispose_flag", "pass_fluidics", "request_changes", "clear"] as const) {
    it(`${type} by the uploader, even holding the reviewing role, is refused with FourEyesError`, () => {
      const s = stateIn(type === "clear" ? "with_fab" : "with_fluidics");
      const e = thrown(() => transition(s, eventOf(type, s.version), uploaderWithAllRoles, ctx()));
      expect(e).toBeInstanceOf(FourEyesError);
      expect(e).toBeInstanceOf(ForbiddenError);
      expect((e as DomainError).status).toBe(403);
      expect((e as DomainError).code).toBe("four_eyes");
      expect((e as DomainError).message).toMatch(/four-eyes/);
    });
  }

  it("the same member with the same roles may review a revision someone else uploaded", () => {
    const s = stateIn("with_fluidics", { uploadedByMemberId: "m-tomas" });
    expect(() => transition(s, eventOf("dispose_flag", s.version), uploaderWithAllRoles, ctx())).not.toThrow();
  });
});

describe("wrong state → 409 with a clear message", () => {
  for (const type of REVIEW_EVENT_TYPES) {
    for (const status of REVIEW_STATUSES.filter((st) => !FROM[type].includes(st))) {
      it(`${type} while ${status} is a conflict`, () => {
        const s = stateIn(status);
        const e = thrown(() => transition(s, eventOf(type, s.version), RIGHT[type].actor, ctx()));
        expect(e).toBeInstanceOf(ConflictError);
        expect((e as DomainError).status).toBe(409);
        expect((e as DomainError).code).toBe("wrong_state");
        // The message names the current state and the states where the step is possible.
        expect((e as DomainError).message).toMatch(/^This revision is /);
        expect((e as DomainError).message).toMatch(/possible only when it is/);
      });
    }
  }
});

describe("stale version → 409 (optimistic concurrency)", () => {
  for (const type of REVIEW_EVENT_TYPES) {
    it(`${type} with an out-of-date expected version is a conflict`, () => {
      const s = stateIn(RIGHT[type].from[0]);
      const e = thrown(() => transition(s, eventOf(type, s.version - 1), RIGHT[type].actor, ctx()));
      expect(e).toBeInstanceOf(StaleVersionError);
      expect((e as DomainError).status).toBe(409);
      expect((e as DomainError).code).toBe("stale_version");
    });
  }

  it("two reviewers passing the same revision at once: exactly one wins under compare-and-set", () => {
    // A minimal stand-in for the service's `UPDATE … SET version = next WHERE version = expected`.
    let stored = stateIn("with_fluidics", { dispositions: [] });
    const withWaiver = transition(stored, eventOf("dispose_flag", stored.version), fluidics, ctx()).next;
    stored = withWaiver;
    const loadedVersion = stored.version;
    const snapshotA = structuredClone(stored);
    const snapshotB = structuredClone(stored);
    const outcomes: string[] = [];
    const compareAndSet = (expected: number, next: ReviewState) => {
      if (stored.version !== expected) throw new StaleVersionError(expected, stored.version);
      stored = next;
    };
    for (const [actor, snap] of [[fluidics, snapshotA], [fluidics2, snapshotB]] as const) {
      try {
        // Both computed their transition from the same loaded snapshot…
        const r = transition(snap, eventOf("pass_fluidics", loadedVersion), actor, ctx());
        compareAndSet(loadedVersion, r.next);
        outcomes.push("won");
      } catch (e) {
        expect(e).toBeInstanceOf(StaleVersionError);
        outcomes.push("conflict");
      }
    }
    expect(outcomes).toEqual(["won", "conflict"]);
    // …and a retry from the fresh record is refused because the stage moved on.
    const retry = thrown(() => transition(stored, eventOf("pass_fluidics", stored.version), fluidics2, ctx())) as DomainError;
    expect(retry.status).toBe(409);
    expect(retry.code).toBe("wrong_state");
  });
});

describe("submit", () => {
  it("needs a note saying what changed (400)", () => {
    const e = thrown(() => transition(stateIn("draft"), { type: "submit", expectedVersion: 7, note: "   " }, designer, ctx())) as DomainError;
    expect(e.status).toBe(400);
    expect(e.message).toMatch(/note is required/);
  });

  it("needs an analysed operating point: geometry only is refused (409)", () => {
    const geometryOnly = { ...analysisA, hasOperatingPoint: false };
    const e = thrown(() => transition(stateIn("draft"), eventOf("submit", 7), designer, ctx({ analysis: geometryOnly }))) as DomainError;
    expect(e.code).toBe("no_operating_point");
    expect(e.status).toBe(409);
    const none = thrown(() => transition(stateIn("draft"), eventOf("submit", 7), designer, ctx({ analysis: null }))) as DomainError;
    expect(none.code).toBe("no_analysis");
  });

  it("asks the fluidics reviewers, except the uploader, to review", () => {
    const r = transition(stateIn("draft"), eventOf("submit", 7), designer, ctx());
    expect(r.effects.notifications).toEqual([
      { kind: "review_requested", to: [{ role: "fluidics_reviewer", exceptMemberIds: [UPLOADER] }], details: expect.objectContaining({ stage: "fluidics" }) },
    ]);
    expect(r.effects.audit).toMatchObject({ action: "review.submitted", details: { from: "draft", to: "with_fluidics", note: "Widened the mixer to lower Re." } });
  });

  it("another designer of the team may submit (only withdrawal is reserved to the uploader)", () => {
    expect(transition(stateIn("draft"), eventOf("submit", 7), otherDesigner, ctx()).next.status).toBe("with_fluidics");
  });
});

describe("the designer's fix during fluidics review (update_analysis)", () => {
  it("runs issue 7's path: submit; waive one flag, must-fix another; designer puts a fixed analysis under review; pass; clear", () => {
    const mustFixFlag = { code: "wall_shear_high", target: { kind: "segment", id: "s8" } };
    const first: ReviewAnalysis = { ...analysisA, flags: [...analysisA.flags, { key: flagKey(mustFixFlag), code: mustFixFlag.code, severity: "block", value: 3.2 }] };
    let s = transition(createReviewState(UPLOADER), eventOf("submit", 0), designer, ctx({ analysis: first })).next;
    s = transition(s, eventOf("dispose_flag", s.version), fluidics, ctx({ analysis: first })).next;
    s = transition(s, { type: "dispose_flag", expectedVersion: s.version, flagKey: flagKey(mustFixFlag), decision: "must_fix", justification: "Widen s8." }, fluidics, ctx({ analysis: first })).next;
    // The fix: s8 widened, so the newer analysis no longer raises the wall-shear flag; the waived flag is unchanged.
    const fixed: ReviewAnalysis = { id: "an-fix", hasOperatingPoint: true, flags: analysisA.flags };
    const stale = thrown(() => transition(s, eventOf("pass_fluidics", s.version), fluidics, ctx({ analysis: fixed }))) as DomainError;
    expect(stale.code).toBe("analysis_changed"); // the fix must be put under review first
    const upd = transition(s, eventOf("update_analysis", s.version), designer, ctx({ analysis: fixed }));
    expect(upd.next.status).toBe("with_fluidics");
    expect(upd.next.analysisId).toBe("an-fix");
    expect(upd.effects.audit).toMatchObject({ action: "review.analysis_updated", details: { previousAnalysisId: "an-1", analysisId: "an-fix" } });
    expect(upd.effects.notifications[0]).toMatchObject({ kind: "review_requested", details: { updated: true } });
    s = upd.next;
    s = transition(s, eventOf("pass_fluidics", s.version), fluidics, ctx({ analysis: fixed })).next;
    const cleared = transition(s, eventOf("clear", s.version), fab, ctx({ analysis: fixed }));
    expect(cleared.next.status).toBe("cleared");
    expect(cleared.next.clearance?.analysisId).toBe("an-fix");
  });

  it("refuses a geometry-only analysis and the analysis already under review (409)", () => {
    const s = stateIn("with_fluidics");
    expect((thrown(() => transition(s, eventOf("update_analysis", 7), designer, ctx({ analysis: { ...analysisA, id: "g", hasOperatingPoint: false } }))) as DomainError).code).toBe("no_operating_point");
    expect((thrown(() => transition(s, eventOf("update_analysis", 7), designer, ctx())) as DomainError).code).toBe("analysis_unchanged");
  });
});

describe("disposing of flags", () => {
  it(`a waiver needs a written justification of at least ${MIN_WAIVER_JUSTIFICATION_CHARS} characters`, () => {
    const short = "x".repeat(MIN_WAIVER_JUSTIFICATION_CHARS - 1);
    const e = thrown(() =>
      transition(stateIn("with_fluidics"), { type: "dispose_flag", expectedVersion: 7, flagKey: flagKey(BLOCK), decision: "waived", justification: short }, fluidics, ctx()),
    ) as DomainError;
    expect(e.status).toBe(400);
    expect(e.message).toMatch(/justification/);
    const ok = transition(
      stateIn("with_fluidics"),
      { type: "dispose_flag", expectedVersion: 7, flagKey: flagKey(BLOCK), decision: "waived", justification: "x".repeat(MIN_WAIVER_JUSTIFICATION_CHARS) },
      fluidics,
      ctx(),
    );
    expect(ok.next.dispositions).toHaveLength(1);
  });

  it("must-fix needs no justification and records who, when and the flag's value", () => {
    const r = transition(stateIn("with_fluidics"), { type: "dispose_flag", expectedVersion: 7, flagKey: flagKey(WARN), decision: "must_fix" }, fluidics, ctx());
    expect(r.next.dispositions).toEqual([
      { flagKey: flagKey(WARN), decision: "must_fix", justification: null, value: 0.02, analysisId: "an-1", byMemberId: fluidics.memberId, atIso: "2026-12-01T10:00:00.000Z" },
    ]);
    expect(r.effects.audit.action).toBe("review.flag_must_fix");
  });

  it("a second decision on the same flag replaces the first, and the audit keeps the previous one", () => {
    const a = transition(stateIn("with_fluidics"), { type: "dispose_flag", expectedVersion: 7, flagKey: flagKey(BLOCK), decision: "must_fix" }, fluidics, ctx());
    const b = transition(a.next, eventOf("dispose_flag", a.nextVersion), fluidics2, ctx());
    expect(b.next.dispositions.map((d) => d.decision)).toEqual(["waived"]);
    expect(b.effects.audit.details).toMatchObject({ previousDecision: "must_fix" });
  });

  it("refuses a flag the analysis under review does not raise (422) and a changed analysis (409)", () => {
    const unknown = thrown(() =>
      transition(stateIn("with_fluidics"), { ...eventOf("dispose_flag", 7), flagKey: "nope|chip|*" } as ReviewEvent, fluidics, ctx()),
    ) as DomainError;
    expect(unknown.status).toBe(422);
    const changed = thrown(() => transition(stateIn("with_fluidics"), eventOf("dispose_flag", 7), fluidics, ctx({ analysis: { ...analysisA, id: "an-2" } }))) as DomainError;
    expect(changed.status).toBe(409);
    expect(changed.code).toBe("analysis_changed");
  });
});

describe("passing fluidics review", () => {
  it("is refused while a block flag is neither waived nor fixed (409 naming the flag)", () => {
    const e = thrown(() => transition(stateIn("with_fluidics"), eventOf("pass_fluidics", 7), fluidics, ctx())) as DomainError;
    expect(e.status).toBe(409);
    expect(e.code).toBe("flags_unresolved");
    expect(e.details).toEqual({ openBlockFlags: [flagKey(BLOCK)], mustFixFlags: [] });
  });

  it("passes when the block flag is waived; an undisposed warn flag does not hold it up", () => {
    const waived = transition(stateIn("with_fluidics"), eventOf("dispose_flag", 7), fluidics, ctx()).next;
    const r = transition(waived, eventOf("pass_fluidics", waived.version), fluidics, ctx());
    expect(r.next.status).toBe("with_fab");
    expect(r.effects.audit.details).toMatchObject({ waived: [flagKey(BLOCK)], fixed: [] });
    expect(r.effects.notifications[0]).toMatchObject({ kind: "review_requested", to: [{ role: "fab_liaison", exceptMemberIds: [UPLOADER] }] });
  });

  it("a must-fix flag blocks passing while raised and counts as fixed once the designer's newer analysis no longer raises it", () => {
    // Reviewer marks the block flag must-fix and requests changes.
    let s = transition(stateIn("with_fluidics"), { type: "dispose_flag", expectedVersion: 7, flagKey: flagKey(BLOCK), decision: "must_fix" }, fluidics, ctx()).next;
    const refused = thrown(() => transition(s, eventOf("pass_fluidics", s.version), fluidics, ctx())) as DomainError;
    expect(refused.details).toEqual({ openBlockFlags: [], mustFixFlags: [flagKey(BLOCK)] });
    s = transition(s, eventOf("request_changes", s.version), fluidics, ctx()).next;
    expect(s.status).toBe("changes_requested");
    // Designer uploads a fix: the new analysis raises only the warn flag.
    const fixedAnalysis: ReviewAnalysis = { id: "an-2", hasOperatingPoint: true, flags: [analysisA.flags[1]] };
    s = transition(s, eventOf("submit", s.version), designer, ctx({ analysis: fixedAnalysis })).next;
    expect(s.analysisId).toBe("an-2");
    const checklist = reviewChecklist(s, fixedAnalysis);
    expect(checklist.find((i) => i.flagKey === flagKey(BLOCK))?.status).toBe("fixed");
    const r = transition(s, eventOf("pass_fluidics", s.version), fluidics, ctx({ analysis: fixedAnalysis }));
    expect(r.next.status).toBe("with_fab");
    expect(r.effects.audit.details).toMatchObject({ fixed: [flagKey(BLOCK)] });
  });

  it("a waiver stops counting when a re-analysis changes the flag's value (the reviewer saw a different number)", () => {
    let s = transition(stateIn("with_fluidics"), eventOf("dispose_flag", 7), fluidics, ctx()).next;
    s = transition(s, eventOf("request_changes", s.version), fluidics, ctx()).next;
    const worse: ReviewAnalysis = { id: "an-3", hasOperatingPoint: true, flags: [{ ...analysisA.flags[0], value: 4100 }] };
    s = transition(s, eventOf("submit", s.version), designer, ctx({ analysis: worse })).next;
    const e = thrown(() => transition(s, eventOf("pass_fluidics", s.version), fluidics, ctx({ analysis: worse }))) as DomainError;
    expect(e.details).toEqual({ openBlockFlags: [flagKey(BLOCK)], mustFixFlags: [] });
  });
});

describe("requesting changes", () => {
  it("needs a note and notifies the designer who uploaded", () => {
    const e = thrown(() => transition(stateIn("with_fab"), { type: "request_changes", expectedVersion: 7, note: "" }, fab, ctx())) as DomainError;
    expect(e.status).toBe(400);
    const r = transition(stateIn("with_fab"), eventOf("request_changes", 7), fab, ctx());
    expect(r.effects.notifications).toEqual([{ kind: "changes_requested", to: [{ memberId: UPLOADER }], details: { stage: "fab", note: "Please fix the turbulent segment." } }]);
  });
});

describe("clearing for tape-out", () => {
  it("is a signature: a failed or missing password re-entry is refused (403)", () => {
    for (const passwordCheck of ["failed", undefined] as const) {
      const e = thrown(() => transition(stateIn("with_fab"), eventOf("clear", 7), fab, ctx({ passwordCheck })));
      expect(e).toBeInstanceOf(SignatureError);
      expect((e as DomainError).status).toBe(403);
    }
  });

  it("needs the fab and the process named (400) and the file's SHA-256 (422)", () => {
    const noFab = thrown(() => transition(stateIn("with_fab"), { ...eventOf("clear", 7), fabName: " " } as ReviewEvent, fab, ctx())) as DomainError;
    expect(noFab.status).toBe(400);
    expect(noFab.message).toMatch(/fab/);
    const noProcess = thrown(() => transition(stateIn("with_fab"), { ...eventOf("clear", 7), process: "" } as ReviewEvent, fab, ctx())) as DomainError;
    expect(noProcess.message).toMatch(/process/);
    const noSha = thrown(() => transition(stateIn("with_fab"), eventOf("clear", 7), fab, ctx({ fileSha256: "abc" }))) as DomainError;
    expect(noSha.status).toBe(422);
  });

  it("notifies the designer and the leads", () => {
    const r = transition(stateIn("with_fab"), eventOf("clear", 7), fab, ctx());
    expect(r.effects.notifications[0].kind).toBe("cleared");
    expect(r.effects.notifications[0].to).toEqual([{ memberId: UPLOADER }, { role: "lead", exceptMemberIds: [] }]);
  });
});

describe("frozen and withdrawn revisions", () => {
  it("a cleared revision is frozen and refuses edits with 409; earlier states are editable", () => {
    expect(isFrozen(stateIn("cleared"))).toBe(true);
    const e = thrown(() => assertEditable(stateIn("cleared"))) as DomainError;
    expect(e).toBeInstanceOf(ConflictError);
    expect(e.code).toBe("revision_frozen");
    expect(e.message).toMatch(/new revision/);
    for (const st of ["draft", "with_fluidics", "with_fab", "changes_requested"] as const) {
      expect(isFrozen(stateIn(st))).toBe(false);
      expect(() => assertEditable(stateIn(st))).not.toThrow();
    }
  });

  it("a withdrawn revision is not frozen but refuses edits too", () => {
    expect(isFrozen(stateIn("withdrawn"))).toBe(false);
    expect((thrown(() => assertEditable(stateIn("withdrawn"))) as DomainError).code).toBe("revision_withdrawn");
  });

  it("the uploader can withdraw before clearance, not after", () => {
    expect(transition(stateIn("with_fab"), eventOf("withdraw", 7), designer, ctx()).next.status).toBe("withdrawn");
    expect((thrown(() => transition(stateIn("cleared"), eventOf("withdraw", 7), designer, ctx())) as DomainError).status).toBe(409);
  });
});

describe("allowedEvents (what the UI shows)", () => {
  it("lists each role's steps at each stage", () => {
    expect(allowedEvents(stateIn("draft"), ["designer"], true)).toEqual(["submit", "withdraw"]);
    expect(allowedEvents(stateIn("with_fluidics"), ["designer"], true)).toEqual(["update_analysis", "withdraw"]);
    expect(allowedEvents(stateIn("draft"), ["designer"], false)).toEqual(["submit"]);
    expect(allowedEvents(stateIn("with_fluidics"), ["fluidics_reviewer"], false)).toEqual(["dispose_flag", "pass_fluidics", "request_changes"]);
    expect(allowedEvents(stateIn("with_fluidics"), ["fluidics_reviewer", "designer"], true)).toEqual(["update_analysis", "withdraw"]);
    expect(allowedEvents(stateIn("with_fab"), ["fab_liaison"], false)).toEqual(["request_changes", "clear"]);
    expect(allowedEvents(stateIn("with_fab"), ["fluidics_reviewer"], false)).toEqual([]);
  });

  it("gives leads and admins (without a working role) nothing, and nobody anything once cleared", () => {
    for (const st of REVIEW_STATUSES) {
      expect(allowedEvents(stateIn(st), ["lead"], false)).toEqual([]);
      expect(allowedEvents(stateIn(st), ["admin"], false)).toEqual([]);
    }
    for (const isUploader of [true, false]) expect(allowedEvents(stateIn("cleared"), ALL_ROLES, isUploader)).toEqual([]);
  });

  it("agrees with transition: a step shown is never refused by role, four-eyes or state, and a step hidden always is", () => {
    const roleSets: Role[][] = [["designer"], ["fluidics_reviewer"], ["fab_liaison"], ["lead"], ["admin"], ["designer", "fluidics_reviewer", "fab_liaison"]];
    for (const st of REVIEW_STATUSES) {
      for (const roles of roleSets) {
        for (const isUploader of [true, false]) {
          const shown = allowedEvents(stateIn(st), roles, isUploader);
          const actor: ReviewActor = { memberId: isUploader ? UPLOADER : "m-other", roles };
          for (const type of REVIEW_EVENT_TYPES) {
            let gateRefused = false;
            try {
              // For dispose, pass, clear: give the inputs that pass their own checks.
              const s = stateIn(st, { dispositions: type === "pass_fluidics" ? transition(stateIn("with_fluidics", { uploadedByMemberId: "m-x" }), eventOf("dispose_flag", 7), fluidics, ctx()).next.dispositions : [] });
              transition(s, eventOf(type, s.version), actor, ctx());
            } catch (e) {
              gateRefused = e instanceof ForbiddenError || (e instanceof ConflictError && e.code === "wrong_state");
            }
            expect(shown.includes(type), `${st} ${roles.join("+")} uploader=${isUploader} ${type}`).toBe(!gateRefused);
          }
        }
      }
    }
  });
});

describe("toReviewAnalysis", () => {
  it("keys flags by code and target and knows a geometry-only document", () => {
    const a = toReviewAnalysis("an-9", {
      totals: null,
      flags: [{ code: "fab_min_width", severity: "block", target: { kind: "chip", id: null }, value: 8e-6, title: "Too narrow" }],
    });
    expect(a).toEqual({ id: "an-9", hasOperatingPoint: false, flags: [{ key: "fab_min_width|chip|*", code: "fab_min_width", severity: "block", value: 8e-6, title: "Too narrow" }] });
  });
});
