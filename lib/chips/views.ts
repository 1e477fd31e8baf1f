/**
 * JSON shapes the API returns for chips, revisions and analyses: small,
 * explicit, ISO timestamps, never a whole row (no storage keys).
 */
import type { ChipListItem, RevisionListItem, AnalysisListItem } from "@/db/queries/chips";
import type { ChipRow, RevisionRow } from "@/db/schema-chips";

export function chipListView(c: ChipListItem) {
  return {
    id: c.id,
    name: c.name,
    purpose: c.purpose,
    last_activity_at: c.lastActivityAt.toISOString(),
    latest_revision: c.latestRevision,
    latest_state: c.latestState,
    worst_flag: c.worstSeverity,
    revisions: c.revisionCount,
  };
}

export function chipView(c: ChipRow) {
  return { id: c.id, name: c.name, purpose: c.purpose, created_at: c.createdAt.toISOString(), last_activity_at: c.lastActivityAt.toISOString() };
}

export function revisionView(r: RevisionRow | RevisionListItem) {
  return {
    id: r.id,
    chip_id: r.chipId,
    number: r.number,
    parent_revision_id: r.parentRevisionId,
    uploaded_at: r.uploadedAt.toISOString(),
    uploaded_by: "uploaderName" in r ? r.uploaderName : undefined,
    file_name: r.fileName,
    size_bytes: r.sizeBytes,
    sha256: r.sha256,
    note: r.note,
    review_state: r.reviewState,
    ...("layers" in r ? { layers: r.layers } : {}),
    ...("analysisCount" in r ? { analyses: r.analysisCount } : {}),
  };
}

export function analysisListView(a: AnalysisListItem) {
  return {
    id: a.id,
    revision_id: a.revisionId,
    operating_point_id: a.operatingPointId,
    operating_point: a.operatingPointName,
    status: a.status,
    error: a.status === "failed" ? { code: a.errorCode, message: a.errorMessage } : null,
    created_at: a.createdAt.toISOString(),
    summary: {
      segments: a.segmentCount,
      max_inlet_pressure_Pa: a.maxInletPressurePa,
      total_flow_m3_per_s: a.totalFlowM3PerS,
      mean_residence_s: a.meanResidenceS,
      max_reynolds: a.maxReynolds,
      flags: { info: a.flagsInfo, warn: a.flagsWarn, block: a.flagsBlock },
      worst_flag: a.worstSeverity,
    },
  };
}
