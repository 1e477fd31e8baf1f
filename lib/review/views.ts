/**
 * JSON shapes the review API returns: small, explicit, ISO timestamps, user
 * names rather than rows. Pure (types only from the service).
 */
import type { CommentView } from "@/db/queries/review";
import type { ReviewOverview } from "./service";

export function commentView(c: CommentView) {
  return {
    id: c.id,
    parent_id: c.parentId,
    author: c.authorName,
    author_user_id: c.authorUserId,
    body: c.body,
    segment_id: c.segmentId,
    point: c.xM !== null && c.yM !== null ? { x_m: c.xM, y_m: c.yM } : null,
    mentions: c.mentions,
    created_at: c.createdAt.toISOString(),
    resolved_at: c.resolvedAt?.toISOString() ?? null,
  };
}

export function reviewOverviewView(o: ReviewOverview) {
  return {
    revision: { id: o.revision.id, chip_id: o.chip.id, chip: o.chip.name, number: o.revision.number, sha256: o.revision.sha256 },
    review: {
      state: o.state.status,
      label: o.statusLabel,
      version: o.state.version,
      since: o.revision.reviewStateSince.toISOString(),
      analysis_id: o.revision.reviewAnalysisId,
    },
    allowed: o.allowed,
    flags: o.checklist.map((i) => ({
      flag_key: i.flagKey,
      code: i.code,
      severity: i.severity,
      status: i.status,
      decision: i.disposition?.decision ?? null,
      justification: i.disposition?.justification ?? null,
    })),
    dispositions: o.dispositionHistory.map((d) => ({
      flag_key: d.flagKey,
      decision: d.decision,
      justification: d.justification,
      value: d.value,
      analysis_id: d.analysisId,
      by: d.byName,
      at: d.at.toISOString(),
    })),
    clearance: o.clearance
      ? {
          by: o.clearance.byName,
          at: o.clearance.at.toISOString(),
          fab: o.clearance.fabName,
          process: o.clearance.process,
          file_sha256: o.clearance.fileSha256,
          analysis_id: o.clearance.analysisId,
        }
      : null,
    comments: o.comments.map(commentView),
  };
}
