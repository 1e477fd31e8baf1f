import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { formatWhen } from "@/components/chips/format";
import { RevisionTimeline, type TimelineRevision } from "@/components/chips/revision-timeline";
import { AccessDenied } from "@/components/ui/access-denied";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { getChip } from "@/db/queries/chips";
import { getPageAccess } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import { listRevisionHistory } from "@/lib/chips/service";

export const metadata: Metadata = { title: "Chip" };

export default async function ChipPage({ params }: { params: Promise<{ workspace: string; chipId: string }> }) {
  const { workspace: slug, chipId: rawId } = await params;
  const chipId = Number(rawId);
  const access = await getPageAccess(slug, "chip.view", `/w/${slug}/chips/${rawId}`);
  if (!access.ok) return <AccessDenied message={access.message} />;
  if (!Number.isInteger(chipId) || chipId <= 0) notFound();
  const chip = await getChip(access.scope, chipId);
  if (!chip) notFound();
  const history = await listRevisionHistory(access, chip.id);
  const canUpload = can(access.scope, "revision.upload");
  const revisions: TimelineRevision[] = history.map(({ revision: r, mapped, analyses }) => ({
    number: r.number,
    uploadedAt: r.uploadedAt.toISOString(),
    uploaderName: r.uploaderName,
    fileName: r.fileName,
    sizeBytes: r.sizeBytes,
    sha256: r.sha256,
    note: r.note,
    reviewState: r.reviewState,
    mapped,
    analyses: analyses.map((a) => ({
      id: a.id,
      name: a.operatingPointName,
      status: a.status as "ok" | "failed",
      worst: a.worstSeverity,
      flags: (a.flagsBlock ?? 0) + (a.flagsWarn ?? 0) + (a.flagsInfo ?? 0),
      errorMessage: a.errorMessage,
      createdAt: a.createdAt.toISOString(),
    })),
  }));
  return (
    <>
      <nav aria-label="Breadcrumb" className="mb-2 text-sm">
        <Link href={`/w/${slug}/chips`}>Chips</Link> <span aria-hidden="true">/</span> <span className="text-ink-600">{chip.name}</span>
      </nav>
      <PageHeader
        title={chip.name}
        lead={
          <>
            {chip.purpose || "No purpose written down."}{" "}
            <span className="text-sm text-ink-500">Last activity {formatWhen(chip.lastActivityAt)}.</span>
          </>
        }
        actions={
          canUpload ? (
            <Link href={`/w/${slug}/chips/${chip.id}/upload`} className="btn-primary">
              Upload a revision
            </Link>
          ) : undefined
        }
      />
      <h2 className="mb-4 text-lg font-semibold text-ink-900">Revision history</h2>
      {revisions.length === 0 ? (
        <EmptyState
          title="No revision yet"
          action={
            canUpload ? (
              <Link href={`/w/${slug}/chips/${chip.id}/upload`} className="btn-primary">
                Upload the first layout
              </Link>
            ) : undefined
          }
        >
          <p>{canUpload ? "Upload the chip’s layout as a DXF to start its history." : "A device designer has not uploaded a layout for this chip yet."}</p>
        </EmptyState>
      ) : (
        <RevisionTimeline slug={slug} chipId={chip.id} revisions={revisions} canEdit={canUpload} />
      )}
    </>
  );
}
